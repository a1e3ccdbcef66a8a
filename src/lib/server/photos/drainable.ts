/**
 * A request whose body can still be read to its end after the handler stopped reading it. When a
 * PATCH fails part-way (the disk filled), the client is still sending; an answer followed by a
 * close while bytes are still arriving makes the kernel reset the connection, which can destroy the
 * answer before the client reads it (RFC 9112 §9.6, tear-down), so the uploader would see a dropped
 * connection instead of the reason. drain() reads the rest and throws it away, up to the length the
 * request declared, while the answer goes out.
 */
export function drainable(request: Request): { request: Request; drain: () => Promise<number> } {
	const reader = request.body!.getReader();
	let draining = false;
	const body = new ReadableStream<Uint8Array>({
		async pull(controller) {
			const { done, value } = await reader.read();
			if (done) controller.close();
			else if (!draining) controller.enqueue(value);
		},
	});
	const wrapped = new Request(request.url, { method: request.method, headers: request.headers, body, signal: request.signal, duplex: 'half' } as RequestInit);
	const declared = Number(request.headers.get('content-length') ?? 0);
	return {
		request: wrapped,
		async drain() {
			draining = true;
			let read = 0;
			// Never more than the request said it would send; a body without a length is not waited for.
			while (read < declared) {
				const { done, value } = await reader.read();
				if (done) break;
				read += value.byteLength;
			}
			await reader.cancel().catch(() => {});
			return read;
		},
	};
}
