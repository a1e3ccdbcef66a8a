// Child processes of the start and test commands: started with their output prefixed, waited for
// until they answer, and stopped together.
import { spawn } from 'node:child_process';

export function startService(name, cmd, args, { cwd, env, quiet = false } = {}) {
	const child = spawn(cmd, args, { cwd, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
	const prefix = (stream, out) =>
		stream.setEncoding('utf8').on('data', (d) => {
			if (quiet) return;
			for (const line of d.split('\n')) if (line.trim()) out.write(`[${name}] ${line}\n`);
		});
	prefix(child.stdout, process.stdout);
	prefix(child.stderr, process.stderr);
	child.exited = new Promise((resolve) => child.on('exit', (code, signal) => resolve({ code, signal })));
	return child;
}

export async function stopService(child, ms = 5000) {
	if (!child || child.exitCode !== null || child.signalCode !== null) return;
	child.kill('SIGTERM');
	const timer = setTimeout(() => child.kill('SIGKILL'), ms);
	await child.exited;
	clearTimeout(timer);
}

/** Polls a URL until it answers (any HTTP status), or fails after `ms`. */
export async function waitForHttp(url, { ms = 60_000, child } = {}) {
	const until = Date.now() + ms;
	while (Date.now() < until) {
		if (child && child.exitCode !== null) throw new Error(`The server exited (code ${child.exitCode}) before answering.`);
		try {
			await fetch(url, { redirect: 'manual' });
			return;
		} catch {
			await new Promise((r) => setTimeout(r, 200));
		}
	}
	throw new Error(`${url} did not answer within ${ms / 1000} s.`);
}
