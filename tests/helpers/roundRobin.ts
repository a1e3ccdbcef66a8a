import http from 'node:http';
import type { AddressInfo } from 'node:net';

/**
 * A round-robin HTTP proxy on loopback, as a load balancer without sticky sessions would be: each
 * request goes to the next instance in turn, Host and all headers unchanged (so each app sees the
 * site's own address and Origin), and the proxy notes which instance served what.
 */
export interface Served {
	method: string;
	path: string;
	target: string;
	status: number;
}

export async function startRoundRobin(targets: string[]): Promise<{ url: string; served: Served[]; close: () => Promise<void> }> {
	const served: Served[] = [];
	let next = 0;
	const server = http.createServer((req, res) => {
		const target = targets[next++ % targets.length]!;
		const u = new URL(target);
		const up = http.request({ host: u.hostname, port: u.port, path: req.url, method: req.method, headers: req.headers }, (answer) => {
			served.push({ method: req.method ?? '', path: req.url ?? '', target, status: answer.statusCode ?? 0 });
			res.writeHead(answer.statusCode ?? 502, answer.headers);
			answer.pipe(res);
		});
		up.on('error', (err) => {
			served.push({ method: req.method ?? '', path: req.url ?? '', target, status: 502 });
			if (!res.headersSent) res.writeHead(502, { 'content-type': 'text/plain' });
			res.end(`proxy: ${err.message}`);
		});
		req.pipe(up);
	});
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const { port } = server.address() as AddressInfo;
	return {
		url: `http://127.0.0.1:${port}`,
		served,
		close: () => {
			server.closeAllConnections();
			return new Promise((resolve) => server.close(() => resolve()));
		},
	};
}
