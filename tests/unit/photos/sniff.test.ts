import fc from 'fast-check';
import sharp, { type Sharp } from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { ACCEPTED_EXTENSIONS, ACCEPTED_MIME, checkEnd, type RasterKind, sniffHead } from '../../../src/lib/photos/sniff.ts';

/** What the uploader and the server pass: the first and last 4096 bytes and the size. */
const head = (b: Uint8Array) => b.subarray(0, 4096);
const tail = (b: Uint8Array) => b.subarray(Math.max(0, b.length - 4096));
const sniff = (b: Uint8Array) => sniffHead(head(b), b.length);
const end = (kind: RasterKind, b: Uint8Array) => checkEnd(kind, head(b), tail(b), b.length);
const bytes = (...parts: (string | number[] | Uint8Array)[]) => {
	const out: number[] = [];
	for (const p of parts) {
		if (typeof p === 'string') out.push(...new TextEncoder().encode(p));
		else out.push(...p);
	}
	return Uint8Array.from(out);
};
const u32le = (n: number) => [n & 0xff, (n >>> 8) & 0xff, (n >>> 16) & 0xff, (n >>> 24) & 0xff];

/** A photograph-like picture: noise, so the encoders write realistic entropy-coded data. */
const picture = () => {
	const w = 96;
	const h = 64;
	const px = new Uint8Array(w * h * 3);
	let seed = 42;
	for (let i = 0; i < px.length; i++) px[i] = (seed = (seed * 1103515245 + 12345) >>> 0) >>> 24;
	return sharp(px, { raw: { width: w, height: h, channels: 3 } });
};

const f: Record<string, Uint8Array> = {};
beforeAll(async () => {
	const buf = async (s: Sharp) => new Uint8Array(await s.toBuffer());
	f.jpeg = await buf(picture().jpeg());
	f.png = await buf(picture().png());
	f.tiff = await buf(picture().tiff());
	f.bigtiff = await buf(picture().tiff({ bigtiff: true }));
	f.webp = await buf(picture().webp());
	f.webpLossless = await buf(picture().webp({ lossless: true }));
	f.avif = await buf(picture().avif());
	f.gif = await buf(picture().gif());
	f.jpegWithSharpXmp = await buf(picture().jpeg().withXmp(XMP));
});

const XMP =
	'<?xpacket begin="\uFEFF" id="W5M0MpCehiHzreSzNTczkc9d"?>' +
	'<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">' +
	'<rdf:Description rdf:about="" xmlns:dc="http://purl.org/dc/elements/1.1/"><dc:title><rdf:Alt>' +
	'<rdf:li xml:lang="x-default">STC.1898.014 front, before treatment</rdf:li></rdf:Alt></dc:title>' +
	'</rdf:Description></rdf:RDF></x:xmpmeta><?xpacket end="w"?>';

/** Inserts a JPEG segment (marker, big-endian length including itself, payload) right after SOI. */
function withSegment(jpeg: Uint8Array, marker: number, payload: Uint8Array): Uint8Array {
	const len = payload.length + 2;
	return bytes(jpeg.subarray(0, 2), [0xff, marker, len >> 8, len & 0xff], payload, jpeg.subarray(2));
}

describe('sniffHead: the accepted photographs, made by sharp', () => {
	it.each([
		['jpeg', 'jpeg', 'image/jpeg'],
		['png', 'png', 'image/png'],
		['tiff', 'tiff', 'image/tiff'],
		['bigtiff', 'tiff', 'image/tiff'],
		['webp', 'webp', 'image/webp'],
		['webpLossless', 'webp', 'image/webp'],
	] as const)('%s is %s', (name, kind, mime) => {
		const b = f[name]!;
		expect(sniff(b)).toEqual({ ok: true, kind, mime });
		expect(end(kind, b)).toEqual({ ok: true });
		expect(ACCEPTED_MIME).toContain(mime);
	});

	it('sharp writes little-endian TIFF here, and BigTIFF with version 43', () => {
		expect(Array.from(f.tiff!.subarray(0, 4))).toEqual([0x49, 0x49, 0x2a, 0x00]);
		expect(Array.from(f.bigtiff!.subarray(0, 4))).toEqual([0x49, 0x49, 0x2b, 0x00]);
	});

	it('accepts a big-endian TIFF header (TIFF 6.0 §2: "MM", 42, IFD offset)', () => {
		const mm = bytes('MM', [0x00, 0x2a, 0x00, 0x00, 0x00, 0x08], [0x00, 0x00], new Uint8Array(200));
		expect(sniff(mm)).toMatchObject({ ok: true, kind: 'tiff' });
		// An IFD offset past the end of the file: the file was cut off.
		const cut = bytes('MM', [0x00, 0x2a, 0x00, 0x01, 0x00, 0x00], new Uint8Array(100));
		expect(sniff(cut)).toMatchObject({ ok: false, code: 'truncated' });
	});

	it('accepts JPEG whose APP1 holds an XMP packet (XML in a JPEG is normal)', () => {
		const app1 = bytes('http://ns.adobe.com/xap/1.0/\0', XMP);
		const b = withSegment(f.jpeg!, 0xe1, app1);
		expect(sniff(b)).toEqual({ ok: true, kind: 'jpeg', mime: 'image/jpeg' });
		expect(end('jpeg', b)).toEqual({ ok: true });
		expect(new TextDecoder().decode(head(f.jpegWithSharpXmp!))).toContain('<x:xmpmeta');
		expect(sniff(f.jpegWithSharpXmp!)).toMatchObject({ ok: true, kind: 'jpeg' });
	});

	it('allows zero padding after the JPEG end marker, and only looks at the end (multi-picture files)', () => {
		expect(end('jpeg', bytes(f.jpeg!, new Uint8Array(300)))).toEqual({ ok: true });
		// Two complete JPEGs back to back, as in an MPF file: ends with the second one's EOI.
		expect(end('jpeg', bytes(f.jpeg!, f.jpeg!))).toEqual({ ok: true });
	});
});

describe('sniffHead: recognised but not decodable here', () => {
	it('AVIF from sharp is avif', () => {
		expect(sniff(f.avif!)).toEqual({ ok: true, kind: 'avif', mime: 'image/avif' });
		expect(end('avif', f.avif!)).toEqual({ ok: true });
		expect(ACCEPTED_MIME).not.toContain('image/avif');
	});
	it('a HEIC ftyp box (ISO/IEC 14496-12 §4.3) is heic; a generic HEIF is image/heif', () => {
		const ftyp = (major: string, ...compat: string[]) => bytes(u32beBytes(16 + 4 * compat.length), 'ftyp', major, [0, 0, 0, 0], ...compat, new Uint8Array(64));
		expect(sniff(ftyp('heic', 'mif1', 'heic'))).toEqual({ ok: true, kind: 'heic', mime: 'image/heic' });
		expect(sniff(ftyp('mif1', 'mif1', 'heic'))).toEqual({ ok: true, kind: 'heic', mime: 'image/heic' });
		expect(sniff(ftyp('mif1', 'mif1', 'miaf'))).toEqual({ ok: true, kind: 'heic', mime: 'image/heif' });
		expect(sniff(ftyp('mif1', 'mif1', 'avif', 'miaf'))).toMatchObject({ ok: true, kind: 'avif' });
		expect(sniff(ftyp('isom', 'isom', 'mp41'))).toMatchObject({ ok: false, code: 'unknown', reason: expect.stringMatching(/video/) });
		expect(sniff(ftyp('crx ', 'crx '))).toMatchObject({ ok: false, code: 'unknown', reason: expect.stringMatching(/CR3/) });
	});
});
const u32beBytes = (n: number) => [(n >>> 24) & 0xff, (n >>> 16) & 0xff, (n >>> 8) & 0xff, n & 0xff];

describe('sniffHead: refusals', () => {
	it('an empty file', () => {
		expect(sniffHead(new Uint8Array(0), 0)).toMatchObject({ ok: false, code: 'empty' });
	});
	it('text named .jpg is text: the name is never consulted', () => {
		const r = sniff(bytes('Jar 14, fluid level 2 cm below the shoulder.\nTopped up 2026-03-15.\n'));
		expect(r).toMatchObject({ ok: false, code: 'text' });
		if (!r.ok) expect(r.reason).toMatch(/^This is a text file, not a photograph\.$/);
	});
	it('Latin-1 and UTF-8 text are text; "BM…" prose is not a bitmap', () => {
		expect(sniff(Uint8Array.from([0x43, 0x61, 0x66, 0xe9, 0x20, 0x6e, 0x6f, 0x74, 0x65, 0x73]))).toMatchObject({ code: 'text' });
		expect(sniff(bytes('Präparat in 70 % Ethanol\n'))).toMatchObject({ code: 'text' });
		expect(sniff(bytes('BMW service notes for the collection van, 2026'))).toMatchObject({ code: 'text' });
	});
	it.each([
		['SVG without XML declaration', '<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>'],
		['SVG with XML declaration', '<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"/>'],
		['SVG with BOM, comment and doctype', '\uFEFF  <?xml version="1.0"?>\n<!-- Created with Inkscape -->\n<!DOCTYPE svg PUBLIC "-//W3C//DTD SVG 1.1//EN" "http://www.w3.org/Graphics/SVG/1.1/DTD/svg11.dtd">\n<svg/>'],
		['SVG with a non-SVG doctype before the root', '<?xml version="1.0"?><!DOCTYPE foo [ ]><svg:svg xmlns:svg="http://www.w3.org/2000/svg"/>'],
	])('%s is svg', (_, text) => {
		const r = sniff(bytes(text));
		expect(r).toEqual({ ok: false, code: 'svg', reason: 'This is an SVG drawing, not a photograph; SVG can carry scripts and is not accepted.' });
	});
	it('SVG in UTF-16 with a byte order mark is svg', () => {
		const s = '<svg xmlns="http://www.w3.org/2000/svg"/>';
		const le = new Uint8Array(2 + s.length * 2);
		le.set([0xff, 0xfe]);
		for (let i = 0; i < s.length; i++) le[2 + i * 2] = s.charCodeAt(i);
		expect(sniff(le)).toMatchObject({ code: 'svg' });
	});
	it.each([
		['<!DOCTYPE html>\n<html lang="en"><head><title>x</title></head></html>'],
		['  <html><body>photo</body></html>'],
		['<!-- saved from url=(0014)about:internet -->\n<HTML><BODY></BODY></HTML>'],
		['<script>fetch("/api")</script>'],
		['<?xml version="1.0"?><html xmlns="http://www.w3.org/1999/xhtml"></html>'],
	])('HTML: %s', (text) => {
		expect(sniff(bytes(text))).toMatchObject({ ok: false, code: 'html' });
	});
	it('other XML is xml', () => {
		expect(sniff(bytes('<?xml version="1.0"?>\n<rss version="2.0"><channel/></rss>'))).toMatchObject({ code: 'xml' });
		expect(sniff(bytes(XMP))).toMatchObject({ code: 'xml' });
	});
	it('PDF, also after some junk', () => {
		expect(sniff(bytes('%PDF-1.7\n%\xe2\xe3\xcf\xd3\n1 0 obj\n<< /Type /Catalog >>\nendobj\n'))).toMatchObject({ code: 'pdf' });
		expect(sniff(bytes([0x00, 0x01, 0x02], '%PDF-1.4\n'))).toMatchObject({ code: 'pdf' });
	});
	it('zip', () => {
		const zip = bytes('PK', [0x03, 0x04, 0x14, 0x00, 0x00, 0x00, 0x08, 0x00], new Uint8Array(20), 'photos/IMG_0001.JPG');
		expect(sniff(zip)).toMatchObject({ code: 'zip', reason: expect.stringMatching(/unpack/) });
	});
	it('GIF (a real one from sharp, and a bare header)', () => {
		expect(sniff(f.gif!)).toMatchObject({ code: 'gif' });
		expect(sniff(bytes('GIF87a', [1, 0, 1, 0, 0, 0, 0]))).toMatchObject({ code: 'gif' });
	});
	it('BMP with a plausible header', () => {
		const pixels = 4 * 2 * 3;
		const bmp = bytes(
			'BM',
			u32le(54 + pixels),
			[0, 0, 0, 0],
			u32le(54),
			u32le(40), // BITMAPINFOHEADER
			u32le(4),
			u32le(2),
			[1, 0, 24, 0],
			new Uint8Array(24),
			new Uint8Array(pixels),
		);
		expect(sniff(bmp)).toMatchObject({ code: 'bmp' });
	});
	it('programs and scripts', () => {
		expect(sniff(bytes([0x7f], 'ELF', [2, 1, 1, 0], new Uint8Array(56)))).toMatchObject({ code: 'executable' });
		expect(sniff(bytes('MZ', [0x90, 0x00, 0x03, 0x00, 0x00, 0x00, 0x04, 0x00], new Uint8Array(64)))).toMatchObject({ code: 'executable' });
		expect(sniff(bytes('#!/bin/sh\nrm -rf /\n'))).toMatchObject({ code: 'executable' });
		expect(sniff(bytes('<?php system($_GET["c"]); ?>'))).toMatchObject({ code: 'executable' });
		expect(sniff(bytes([0xcf, 0xfa, 0xed, 0xfe], new Uint8Array(28)))).toMatchObject({ code: 'executable' });
	});
	it('unknown binary', () => {
		expect(sniff(Uint8Array.from({ length: 300 }, (_, i) => (i * 7) % 256))).toMatchObject({ code: 'unknown' });
		expect(sniff(bytes('RIFF', u32le(100), 'WAVEfmt ', new Uint8Array(100)))).toMatchObject({ code: 'unknown', reason: expect.stringMatching(/RIFF/) });
	});
	it('a header cut short is truncated', () => {
		expect(sniff(Uint8Array.from([0x89, 0x50, 0x4e, 0x47]))).toMatchObject({ code: 'truncated' });
		expect(sniff(f.png!.subarray(0, 12))).toMatchObject({ code: 'truncated' });
		expect(sniff(f.webp!.subarray(0, 10))).toMatchObject({ code: 'truncated' });
		expect(sniff(Uint8Array.from([0xff, 0xd8]))).toMatchObject({ code: 'truncated' });
	});
});

describe('polyglots: an image with something else inside', () => {
	it.each([
		['<script>', '<script>alert(document.cookie)</script>'],
		['<html>', '<html><body onload="x()">'],
		['<svg', '<svg onload="alert(1)"/>'],
		['<?php', '<?php eval($_POST["x"]); ?>'],
		['<!DOCTYPE', '<!DOCTYPE html>'],
	])('JPEG with %s in a comment segment is refused from its head', (_, markup) => {
		const b = withSegment(f.jpeg!, 0xfe, bytes(markup));
		expect(sniff(b)).toMatchObject({ ok: false, code: 'polyglot' });
	});
	it('PNG with a script in a tEXt chunk, and a GIF/JS polyglot, are refused', () => {
		// Chunk CRC left as zeros: the sniffer does not decode; the decoder would also refuse it.
		const text = bytes('Comment\0<script src=//evil.example/x.js></script>');
		const chunk = bytes(u32beBytes(text.length), 'tEXt', text, [0, 0, 0, 0]);
		const png = bytes(f.png!.subarray(0, 33), chunk, f.png!.subarray(33));
		expect(sniff(png)).toMatchObject({ code: 'polyglot' });
		expect(sniff(bytes('GIF89a/*', [0, 0, 0, 0], '*/=1;<script>alert(1)</script>'))).toMatchObject({ code: 'polyglot' });
	});
	it('does not mistake words that merely start like a tag', () => {
		const b = withSegment(f.jpeg!, 0xfe, bytes('<svgfile> <scripted> <htmlish>'));
		expect(sniff(b)).toMatchObject({ ok: true, kind: 'jpeg' });
	});
	it('JPEG with <script> appended after EOI', () => {
		const b = bytes(f.jpeg!, '<script>alert(1)</script>');
		expect(sniff(b)).toMatchObject({ ok: true });
		expect(end('jpeg', b)).toMatchObject({ ok: false, code: 'polyglot' });
	});
	it('JPEG with a zip appended', () => {
		const zip = bytes('PK', [3, 4], new Uint8Array(26), 'a.txt', 'hello', 'PK', [1, 2], new Uint8Array(42), 'a.txt', 'PK', [5, 6], new Uint8Array(18));
		const b = bytes(f.jpeg!, zip);
		expect(end('jpeg', b)).toMatchObject({ ok: false, code: 'polyglot', reason: expect.stringMatching(/zip/) });
	});
	it('JPEG with a PDF appended, or other data after EOI', () => {
		expect(end('jpeg', bytes(f.jpeg!, '%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n'))).toMatchObject({ code: 'polyglot', reason: expect.stringMatching(/PDF/) });
		expect(end('jpeg', bytes(f.jpeg!, 'anything else at all'))).toMatchObject({ code: 'polyglot', reason: expect.stringMatching(/after the end/) });
	});
	it('a truncated JPEG (cut in the middle)', () => {
		const b = f.jpeg!.subarray(0, Math.floor(f.jpeg!.length / 2));
		expect(sniff(b)).toMatchObject({ ok: true, kind: 'jpeg' });
		expect(end('jpeg', b)).toMatchObject({ ok: false, code: 'truncated' });
	});
	it('PNG with bytes after IEND, and a PNG cut short', () => {
		expect(end('png', bytes(f.png!, 'extra'))).toMatchObject({ ok: false, code: 'polyglot' });
		expect(end('png', f.png!.subarray(0, f.png!.length - 5))).toMatchObject({ ok: false, code: 'truncated' });
	});
	it('WebP whose RIFF size disagrees with the file size', () => {
		const w = f.webp!;
		// Data after the declared end: the RIFF size is smaller than the file.
		expect(end('webp', bytes(w, 'trailing'))).toMatchObject({ ok: false, code: 'polyglot' });
		// RIFF size larger than the file: cut off.
		const bigger = Uint8Array.from(w);
		bigger.set(u32le(w.length - 8 + 100), 4);
		expect(end('webp', bigger)).toMatchObject({ ok: false, code: 'truncated' });
		const smaller = Uint8Array.from(w);
		smaller.set(u32le(w.length - 8 - 2), 4);
		expect(end('webp', smaller)).toMatchObject({ ok: false, code: 'polyglot' });
	});
	it('TIFF and AVIF have no end marker, but an attached zip or page is still found', () => {
		expect(end('tiff', bytes(f.tiff!, new Uint8Array(10)))).toEqual({ ok: true });
		expect(end('tiff', bytes(f.tiff!, '</html>'))).toMatchObject({ code: 'polyglot' });
		expect(end('avif', bytes(f.avif!, 'PK', [5, 6], new Uint8Array(18)))).toMatchObject({ code: 'polyglot' });
	});
});

describe('constants', () => {
	it('list the accepted types and extensions', () => {
		expect([...ACCEPTED_MIME]).toEqual(['image/jpeg', 'image/png', 'image/tiff', 'image/webp']);
		expect([...ACCEPTED_EXTENSIONS]).toEqual(['.jpg', '.jpeg', '.png', '.tif', '.tiff', '.webp']);
		expect(Object.isFrozen(ACCEPTED_MIME)).toBe(true);
	});
});

describe('robustness', () => {
	it('sniffHead never throws, for any bytes and any claimed size', () => {
		fc.assert(
			fc.property(fc.uint8Array({ minLength: 0, maxLength: 5000 }), fc.oneof(fc.integer(), fc.double(), fc.constantFrom(0, -1, Number.NaN, Infinity)), (b, size) => {
				const r = sniffHead(b, size);
				expect(typeof r.ok).toBe('boolean');
				if (!r.ok) expect(r.reason).toMatch(/\.$/);
			}),
			{ numRuns: 500 },
		);
	});
	it('sniffHead never throws on mutated real headers, and checkEnd never throws', () => {
		const kinds: RasterKind[] = ['jpeg', 'png', 'tiff', 'webp', 'heic', 'avif'];
		fc.assert(
			fc.property(
				fc.constantFrom('jpeg', 'png', 'tiff', 'bigtiff', 'webp', 'avif'),
				fc.nat({ max: 64 }),
				fc.array(fc.tuple(fc.nat({ max: 40 }), fc.integer({ min: 0, max: 255 })), { maxLength: 4 }),
				fc.constantFrom(...kinds),
				(name, cut, edits, kind) => {
					const b = Uint8Array.from(f[name]!.subarray(0, cut));
					for (const [i, v] of edits) if (i < b.length) b[i] = v;
					sniffHead(b, b.length);
					checkEnd(kind, b, b, b.length);
				},
			),
		);
	});
});
