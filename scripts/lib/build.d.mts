// Types for build.mjs.
export declare function ensureBuild(root: string, log?: (line: string) => void): boolean;
