// Types for cluster.mjs (plain JS so it runs before npm ci).
type Log = (line: string) => void;
export declare const DEFAULT_PG_PORT: number;
export declare function findPgBin(opts?: { install?: boolean; log?: Log }): Promise<string>;
export declare function clusterRunning(dataDir: string): boolean;
export declare function ensureCluster(opts: { dataDir: string; port?: number; log?: Log }): Promise<{
	dataDir: string;
	socketDir: string;
	port: number;
	bin: string;
	user: string;
	password: string;
}>;
export declare function startCluster(opts: { dataDir: string; port?: number; log?: Log; database?: string }): Promise<{
	url: string;
	port: number;
	stop(opts?: { mode?: 'smart' | 'fast' | 'immediate' }): Promise<boolean>;
}>;
export declare function createDatabase(opts: { dataDir: string; port?: number; name: string; log?: Log }): Promise<boolean>;
export declare function stopCluster(opts: { dataDir: string; mode?: 'smart' | 'fast' | 'immediate'; log?: Log }): Promise<boolean>;
export declare function removeCluster(opts: { dataDir: string; log?: Log }): Promise<void>;
export declare function freePort(): Promise<number>;
