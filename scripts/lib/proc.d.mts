// Types for proc.mjs.
import type { ChildProcess } from 'node:child_process';
export type Service = ChildProcess & { exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }> };
export declare function startService(
	name: string,
	cmd: string,
	args: string[],
	opts?: { cwd?: string; env?: Record<string, string | undefined>; quiet?: boolean },
): Service;
export declare function stopService(child: Service | undefined, ms?: number): Promise<void>;
export declare function waitForHttp(url: string, opts?: { ms?: number; child?: Service }): Promise<void>;
