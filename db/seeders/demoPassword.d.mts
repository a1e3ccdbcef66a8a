// Types for demoPassword.mjs.
export declare const DEFAULT_DEMO_PASSWORD: string;
export declare function demoPassword(): string;
