// The baseline for bench/uploadThroughput.ts: the least a Node server can do to take an upload, a
// PUT body streamed to a file with stream.pipeline, in a process of its own as the app is.
//   node --import tsx bench/lib/plainPutServer.ts <folder>   prints {"port": n} once listening
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { pipeline } from 'node:stream/promises';

const dir = process.argv[2];
if (!dir) {
	console.error('usage: plainPutServer.ts <folder>');
	process.exit(2);
}
let n = 0;

const server = http.createServer((req, res) => {
	if (req.method !== 'PUT') {
		res.writeHead(405).end();
		return;
	}
	const file = path.join(dir, `put-${n++}.bin`);
	pipeline(req, fs.createWriteStream(file)).then(
		() => res.writeHead(201, { 'content-type': 'text/plain' }).end(`${fs.statSync(file).size}\n`),
		(err: Error) => res.writeHead(500).end(`${err.message}\n`),
	);
});
// Node's default request timeout (5 minutes) is ample for 500 MB on loopback.
server.listen(0, '127.0.0.1', () => {
	const address = server.address();
	if (address && typeof address === 'object') console.log(JSON.stringify({ port: address.port }));
});
process.on('SIGTERM', () => server.close(() => process.exit(0)));
