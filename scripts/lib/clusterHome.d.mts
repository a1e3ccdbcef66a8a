// Types for clusterHome.mjs.
export declare function clusterDataDir(root: string, log?: (line: string) => void): string;
