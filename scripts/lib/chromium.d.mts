// Types for chromium.mjs.
export declare const CHROMIUM: string;
export declare function ensureChromium(log: (m: string) => void): void;
