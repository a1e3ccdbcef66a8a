/**
 * A minimal refusal page for the middleware, which runs before any layout. Styled inline because it
 * must not depend on the app's stylesheet being reachable.
 */
export function forbiddenPage(message: string, status: number): Response {
	const safe = message.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
	const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>Not available · Meniscus</title></head>
<body style="font-family:system-ui,sans-serif;background:#faf8f3;color:#172124;margin:0;display:grid;place-items:center;min-height:100vh">
<main style="max-width:32rem;padding:2rem"><h1 style="font-family:Georgia,serif">Not available to you</h1>
<p>${safe}</p><p>If you need it for your work, ask an administrator to change your role.</p>
<p><a href="/" style="color:#1d5350">Back to your home page</a></p></main></body></html>`;
	return new Response(html, { status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}
