/**
 * What an uploaded file is, decided from its bytes and never from its name or the type the browser
 * claims. A photograph in a condition record is evidence, so the server only keeps raster images it
 * can decode and check; anything else is refused with one plain sentence the conservator can act on.
 *
 * Pure TypeScript (no Node imports): the uploader runs the same checks in the browser on the first
 * and last few kilobytes of a file before sending it, and the server runs them again on what arrived.
 *
 * Byte layouts relied on, by specification:
 * - JPEG: ISO/IEC 10918-1 Annex B markers: SOI = FF D8, every marker starts with FF, EOI = FF D9.
 * - PNG: PNG spec (W3C, 3rd ed.) §5.2 signature 89 50 4E 47 0D 0A 1A 0A; §5.6 IHDR is the first
 *   chunk; §11.2.5 IEND is the last chunk, always 00 00 00 00 "IEND" AE 42 60 82 (empty data + CRC).
 * - TIFF: TIFF 6.0 §2 header: "II" or "MM", the number 42 in that byte order, then the offset of the
 *   first IFD. BigTIFF (the Aware Systems BigTIFF design note, from memory): version 43, then the
 *   offset byte size 8, a zero word and an 8-byte IFD offset.
 * - WebP: RIFF/WebP container spec (Google): "RIFF", a little-endian size counting from byte 8,
 *   "WEBP", then the first chunk "VP8 ", "VP8L" or "VP8X".
 * - HEIF/AVIF: ISO/IEC 14496-12 §4.2 box header (32-bit big-endian size, 4-byte type) and §4.3 ftyp
 *   box (major brand, minor version, compatible brands); brands from ISO/IEC 23008-12 (HEIF: mif1,
 *   msf1, heic, heix, …) and the AV1 Image File Format spec (avif, avis), from memory.
 * - Text and markup: WHATWG MIME Sniffing §7.1 "binary data byte" and the HTML tag patterns, from
 *   memory; we use them as a guide, not a full implementation.
 */

export type RasterKind = 'jpeg' | 'png' | 'tiff' | 'webp' | 'heic' | 'avif';
export type RefusalCode =
	| 'empty'
	| 'svg'
	| 'html'
	| 'pdf'
	| 'xml'
	| 'text'
	| 'zip'
	| 'gif'
	| 'bmp'
	| 'executable'
	| 'polyglot'
	| 'truncated'
	| 'unknown';
export type SniffResult = { ok: true; kind: RasterKind; mime: string } | { ok: false; code: RefusalCode; reason: string };
export type EndResult = { ok: true } | { ok: false; code: 'polyglot' | 'truncated'; reason: string };

/** The kinds the server decodes and keeps. HEIC/HEIF and AVIF are recognised only, to say so plainly. */
export const ACCEPTED_KINDS: readonly RasterKind[] = Object.freeze(['jpeg', 'png', 'tiff', 'webp']);
export const ACCEPTED_MIME: readonly string[] = Object.freeze(['image/jpeg', 'image/png', 'image/tiff', 'image/webp']);
export const ACCEPTED_EXTENSIONS: readonly string[] = Object.freeze(['.jpg', '.jpeg', '.png', '.tif', '.tiff', '.webp']);

/** How much of the head and tail callers are expected to pass. */
export const SNIFF_BYTES = 4096;

const refuse = (code: RefusalCode, reason: string): SniffResult => ({ ok: false, code, reason });
const ok = (kind: RasterKind, mime: string): SniffResult => ({ ok: true, kind, mime });

const REASONS = {
	empty: 'The file is empty.',
	svg: 'This is an SVG drawing, not a photograph; SVG can carry scripts and is not accepted.',
	html: 'This is a web page (HTML), not a photograph.',
	xml: 'This is an XML document, not a photograph.',
	text: 'This is a text file, not a photograph.',
	pdf: 'This is a PDF document, not a photograph; export the page as a JPEG or TIFF if it holds the picture.',
	zip: 'This is a zip archive; unpack it and upload the photographs inside.',
	gif: 'This is a GIF; its 256 colours are too few for a record photograph, so upload the original JPEG, PNG, TIFF or WebP.',
	bmp: 'This is a BMP bitmap, which is not accepted; save it as PNG or TIFF and upload that.',
	executable: 'This is a program or script, not a photograph.',
	polyglotHead: 'This file starts like an image but also contains web-page or script code, so it is not accepted.',
	unknown: 'This file is not a photograph this system recognises (accepted: JPEG, PNG, TIFF or WebP).',
	truncatedHead: 'The file ends before its image header is complete; it was probably cut off while copying.',
} as const;

// ——— small byte helpers (bounds-checked: a short head must never throw) ———

function startsWith(b: Uint8Array, sig: readonly number[], at = 0): boolean {
	if (b.length < at + sig.length) return false;
	for (let i = 0; i < sig.length; i++) if (b[at + i] !== sig[i]) return false;
	return true;
}
/** True when `b` is shorter than `sig` but agrees with it as far as it goes (a header cut short). */
function isPrefixOf(b: Uint8Array, sig: readonly number[]): boolean {
	if (b.length >= sig.length || b.length === 0) return false;
	for (let i = 0; i < b.length; i++) if (b[i] !== sig[i]) return false;
	return true;
}
const ascii = (s: string): number[] => Array.from(s, (c) => c.charCodeAt(0));
const u32le = (b: Uint8Array, i: number) => ((b[i] ?? 0) | ((b[i + 1] ?? 0) << 8) | ((b[i + 2] ?? 0) << 16)) + (b[i + 3] ?? 0) * 0x1000000;
const u32be = (b: Uint8Array, i: number) => (b[i] ?? 0) * 0x1000000 + (((b[i + 1] ?? 0) << 16) | ((b[i + 2] ?? 0) << 8) | (b[i + 3] ?? 0));
const fourcc = (b: Uint8Array, i: number) => String.fromCharCode(b[i] ?? 0, b[i + 1] ?? 0, b[i + 2] ?? 0, b[i + 3] ?? 0);

/** Index of `needle` in `hay` (ASCII letters compared case-insensitively), or -1. */
function indexOfAscii(hay: Uint8Array, needle: string, caseless: boolean, from = 0): number {
	const n = ascii(caseless ? needle.toLowerCase() : needle);
	const first = n[0];
	if (first === undefined) return -1;
	outer: for (let i = Math.max(0, from); i + n.length <= hay.length; i++) {
		let c = hay[i]!;
		if (caseless && c >= 0x41 && c <= 0x5a) c += 0x20;
		if (c !== first) continue;
		for (let j = 1; j < n.length; j++) {
			let d = hay[i + j]!;
			if (caseless && d >= 0x41 && d <= 0x5a) d += 0x20;
			if (d !== n[j]) continue outer;
		}
		return i;
	}
	return -1;
}
function lastIndexOf(hay: Uint8Array, sig: readonly number[]): number {
	for (let i = hay.length - sig.length; i >= 0; i--) if (startsWith(hay, sig, i)) return i;
	return -1;
}

// ——— signatures ———

const SIG = {
	jpeg: [0xff, 0xd8, 0xff], // SOI followed by the first marker's FF (ISO/IEC 10918-1 B.1.1.3)
	png: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], // PNG spec §5.2
	tiffLE: [0x49, 0x49, 0x2a, 0x00], // TIFF 6.0 §2: "II", 42 little-endian
	tiffBE: [0x4d, 0x4d, 0x00, 0x2a], // "MM", 42 big-endian
	bigLE: [0x49, 0x49, 0x2b, 0x00, 0x08, 0x00, 0x00, 0x00], // BigTIFF: 43, offset size 8, zero (from memory)
	bigBE: [0x4d, 0x4d, 0x00, 0x2b, 0x00, 0x08, 0x00, 0x00],
	riff: ascii('RIFF'),
	pdf: ascii('%PDF-'),
	gif87: ascii('GIF87a'),
	gif89: ascii('GIF89a'),
	elf: [0x7f, 0x45, 0x4c, 0x46],
	shebang: ascii('#!'),
	iend: [0x00, 0x00, 0x00, 0x00, 0x49, 0x45, 0x4e, 0x44, 0xae, 0x42, 0x60, 0x82], // PNG spec §11.2.5
	eoi: [0xff, 0xd9],
	zipEocd: [0x50, 0x4b, 0x05, 0x06], // PKWARE APPNOTE §4.3.16 end of central directory (from memory)
} as const;

/** Zip local file header, empty archive, spanned archive (PKWARE APPNOTE §4.3.7, from memory). */
const ZIP_STARTS = [
	[0x50, 0x4b, 0x03, 0x04],
	[0x50, 0x4b, 0x05, 0x06],
	[0x50, 0x4b, 0x07, 0x08],
] as const;

/** Mach-O (32/64-bit, both byte orders) and fat binaries; from memory. CA FE BA BE is also Java. */
const MACHO = [
	[0xfe, 0xed, 0xfa, 0xce],
	[0xfe, 0xed, 0xfa, 0xcf],
	[0xce, 0xfa, 0xed, 0xfe],
	[0xcf, 0xfa, 0xed, 0xfe],
	[0xca, 0xfe, 0xba, 0xbe],
] as const;

/**
 * Markup that makes a browser or a PHP server run what follows. Only these: an XMP packet in a JPEG
 * APP1 segment or a PNG iTXt chunk is XML too (`<?xpacket`, `<x:xmpmeta`, `<rdf:RDF`) and is
 * legitimate, so XML in general is not a sign of a polyglot. A tag name must end at whitespace, `>`
 * or `/` to count, as in HTML tokenising, which also keeps chance matches in compressed data rare.
 */
const HEAD_MARKERS = ['<script', '<html', '<svg', '<?php', '<!doctype', '<iframe'] as const;
/** %PDF- anywhere in the head of an image: a PDF reader looks for it in the first kilobyte. */
const PDF_IN_HEAD = '%PDF-';

function isTagEnd(c: number | undefined): boolean {
	return c === undefined || c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0c || c === 0x0d || c === 0x3e || c === 0x2f;
}
function findMarkup(b: Uint8Array): string | null {
	for (const m of HEAD_MARKERS) {
		let from = 0;
		for (;;) {
			const at = indexOfAscii(b, m, true, from);
			if (at < 0) break;
			if (isTagEnd(b[at + m.length])) return m;
			from = at + 1;
		}
	}
	if (indexOfAscii(b, PDF_IN_HEAD, false) >= 0) return PDF_IN_HEAD;
	return null;
}

// ——— the raster kinds ———

function sniffTiff(head: Uint8Array, fileSize: number): SniffResult | null {
	const le = startsWith(head, SIG.tiffLE) || startsWith(head, SIG.bigLE);
	const big = startsWith(head, SIG.bigLE) || startsWith(head, SIG.bigBE);
	if (!le && !startsWith(head, SIG.tiffBE) && !big) return null;
	const need = big ? 16 : 8;
	if (head.length < need) return refuse('truncated', REASONS.truncatedHead);
	// TIFF 6.0 §2: bytes 4–7 are the offset of the first IFD, which lies after the 8-byte header.
	// BigTIFF: bytes 8–15; the high half must be 0 for any file this system could take anyway.
	let offset: number;
	if (big) {
		const hi = le ? u32le(head, 12) : u32be(head, 8);
		const lo = le ? u32le(head, 8) : u32be(head, 12);
		offset = hi === 0 ? lo : Number.POSITIVE_INFINITY;
	} else offset = le ? u32le(head, 4) : u32be(head, 4);
	if (offset < need) return refuse('unknown', REASONS.unknown);
	if (offset >= fileSize) return refuse('truncated', 'The TIFF file ends before its first image directory; it was probably cut off while copying.');
	return ok('tiff', 'image/tiff');
}

function sniffPng(head: Uint8Array, fileSize: number): SniffResult | null {
	if (!startsWith(head, SIG.png)) return null;
	// PNG spec §5.6: IHDR comes first, with 13 bytes of data: 00 00 00 0D "IHDR".
	if (head.length < 16) return refuse('truncated', REASONS.truncatedHead);
	if (!startsWith(head, [0, 0, 0, 13, ...ascii('IHDR')], 8)) return refuse('unknown', REASONS.unknown);
	// Signature (8) + IHDR (25) + one IDAT (at least 12) + IEND (12).
	if (fileSize < 57) return refuse('truncated', 'The PNG file is too short to hold an image; it was probably cut off while copying.');
	return ok('png', 'image/png');
}

function sniffWebp(head: Uint8Array): SniffResult | null {
	if (!startsWith(head, SIG.riff)) return null;
	if (head.length < 12) return refuse('truncated', REASONS.truncatedHead);
	if (fourcc(head, 8) !== 'WEBP') {
		// RIFF also holds WAV audio and AVI video.
		return refuse('unknown', 'This is a RIFF file (such as audio or video), not a photograph.');
	}
	if (head.length < 16) return refuse('truncated', REASONS.truncatedHead);
	const chunk = fourcc(head, 12);
	if (chunk !== 'VP8 ' && chunk !== 'VP8L' && chunk !== 'VP8X') return refuse('unknown', REASONS.unknown);
	return ok('webp', 'image/webp');
}

const HEIC_BRANDS = new Set(['heic', 'heix', 'heim', 'heis', 'hevc', 'hevx', 'hevm', 'hevs']);
const HEIF_GENERIC = new Set(['mif1', 'msf1', 'mif2', 'heif']);
const AVIF_BRANDS = new Set(['avif', 'avis']);

function sniffIsoBmff(head: Uint8Array): SniffResult | null {
	// ISO/IEC 14496-12 §4.2/§4.3: [size:u32 BE]["ftyp"][major brand][minor version][compatible brands…]
	if (head.length < 8 || fourcc(head, 4) !== 'ftyp') return null;
	const size = u32be(head, 0);
	if (head.length < 12) return refuse('truncated', REASONS.truncatedHead);
	if (size < 16) return refuse('unknown', REASONS.unknown);
	const major = fourcc(head, 8);
	const brands = [major];
	for (let i = 16; i + 4 <= Math.min(size, head.length); i += 4) brands.push(fourcc(head, i));
	// The major brand says what the file is first; AVIF files often list mif1 and HEIF ones miaf.
	const pick = (list: string[]): SniffResult | null => {
		for (const b of list) {
			if (AVIF_BRANDS.has(b)) return ok('avif', 'image/avif');
			if (HEIC_BRANDS.has(b)) return ok('heic', 'image/heic');
		}
		return null;
	};
	const chosen = pick([major]) ?? pick(brands);
	if (chosen) return chosen;
	if (brands.some((b) => HEIF_GENERIC.has(b))) return ok('heic', 'image/heif');
	if (brands.includes('crx ')) return refuse('unknown', 'This is a Canon raw (CR3) file; export it as TIFF or JPEG and upload that.');
	return refuse('unknown', 'This is a video or other media file, not a photograph.');
}

function plausibleBmp(head: Uint8Array, fileSize: number): boolean {
	// BITMAPFILEHEADER (from memory, Microsoft docs): "BM", u32 file size, two reserved u16, u32 pixel
	// offset; then the DIB header, whose first u32 is its own size: 12 (OS/2 core), 40, 52, 56, 64,
	// 108 or 124 (INFO, V2, V3, OS/2 v2, V4, V5). Text starting with "BM" fails these.
	if (head.length < 18 || head[0] !== 0x42 || head[1] !== 0x4d) return false;
	const declared = u32le(head, 2);
	const pixelOffset = u32le(head, 10);
	const dib = u32le(head, 14);
	if (![12, 40, 52, 56, 64, 108, 124].includes(dib)) return false;
	if (pixelOffset < 14 + dib || pixelOffset > fileSize) return false;
	// Lenient on the size field: 0 is allowed, and some writers get it a few bytes wrong (from memory).
	return declared === 0 || declared === fileSize || (declared > 14 + dib && declared <= fileSize + 16);
}

// ——— text and markup ———

/** WHATWG MIME Sniffing "binary data byte" (from memory): 00–08, 0B, 0E–1A, 1C–1F. */
function isBinaryByte(c: number): boolean {
	return c <= 0x08 || c === 0x0b || (c >= 0x0e && c <= 0x1a) || (c >= 0x1c && c <= 0x1f);
}

/** The head as text, or null when it holds binary bytes. Handles the UTF-8 and UTF-16 byte order marks. */
function asText(head: Uint8Array): string | null {
	if (startsWith(head, [0xfe, 0xff]) || startsWith(head, [0xff, 0xfe])) {
		const le = head[0] === 0xff;
		// An odd final byte is half a character cut off by the head limit; leave it out.
		const body = head.subarray(2, head.length - (head.length % 2));
		try {
			const s = new TextDecoder(le ? 'utf-16le' : 'utf-16be').decode(body);
			return /[\u0000-\u0008\u000b\u000e-\u001a\u001c-\u001f]/.test(s) ? null : s;
		} catch {
			return null;
		}
	}
	const body = startsWith(head, [0xef, 0xbb, 0xbf]) ? head.subarray(3) : head;
	for (const c of body) if (isBinaryByte(c)) return null;
	// Not fatal on bad UTF-8: a Latin-1 text file is still text, and only the start matters here.
	return new TextDecoder('utf-8').decode(body);
}

/** HTML start patterns, WHATWG MIME Sniffing §7.1 (from memory), matched case-insensitively. */
const HTML_TAGS = ['html', 'head', 'body', 'script', 'iframe', 'h1', 'div', 'font', 'table', 'a', 'style', 'title', 'b', 'br', 'p', 'meta', 'link'];

function classifyText(s: string): SniffResult {
	let t = s;
	let sawXmlDecl = false;
	// Skip whitespace, comments, processing instructions and non-SVG/HTML doctypes before the root.
	for (let guard = 0; guard < 64; guard++) {
		t = t.replace(/^[\s\uFEFF]+/, '');
		if (t.startsWith('<!--')) {
			const end = t.indexOf('-->');
			if (end < 0) return sawXmlDecl ? refuse('xml', REASONS.xml) : refuse('text', REASONS.text);
			t = t.slice(end + 3);
			continue;
		}
		if (t.startsWith('<?')) {
			if (/^<\?php\b/i.test(t)) return refuse('executable', 'This is a PHP script, not a photograph.');
			if (/^<\?xml\b/i.test(t)) sawXmlDecl = true;
			const end = t.indexOf('?>');
			if (end < 0) return refuse('xml', REASONS.xml);
			t = t.slice(end + 2);
			continue;
		}
		const doctype = /^<!doctype\s+([A-Za-z][\w:.-]*)/i.exec(t);
		if (doctype) {
			const name = doctype[1]!.toLowerCase();
			if (name === 'svg') return refuse('svg', REASONS.svg);
			if (name === 'html') return refuse('html', REASONS.html);
			const end = t.indexOf('>');
			if (end < 0) return refuse('xml', REASONS.xml);
			t = t.slice(end + 1);
			continue;
		}
		break;
	}
	const root = /^<([A-Za-z_][\w:.-]*)/.exec(t);
	if (root) {
		const name = root[1]!.toLowerCase();
		// A namespace prefix (<svg:svg>) still makes an SVG document.
		const local = name.includes(':') ? name.slice(name.indexOf(':') + 1) : name;
		if (local === 'svg') return refuse('svg', REASONS.svg);
		if (local === 'html' || (!sawXmlDecl && HTML_TAGS.includes(name))) return refuse('html', REASONS.html);
		return refuse('xml', REASONS.xml);
	}
	if (sawXmlDecl) return refuse('xml', REASONS.xml);
	return refuse('text', REASONS.text);
}

// ——— the public checks ———

/**
 * What the file is, from its first bytes (callers pass up to 4096) and its size in bytes. Never
 * throws; an unexpected shape is an 'unknown' refusal.
 */
export function sniffHead(head: Uint8Array, fileSize: number): SniffResult {
	if (!(fileSize > 0) || head.length === 0) return refuse('empty', REASONS.empty);
	const size = Number.isFinite(fileSize) ? fileSize : Number.MAX_SAFE_INTEGER;

	const raster = startsWith(head, SIG.jpeg)
		? size < 4
			? refuse('truncated', REASONS.truncatedHead)
			: ok('jpeg', 'image/jpeg')
		: (sniffPng(head, size) ?? sniffTiff(head, size) ?? sniffWebp(head) ?? sniffIsoBmff(head));
	if (raster) {
		if (raster.ok && findMarkup(head)) return refuse('polyglot', REASONS.polyglotHead);
		return raster;
	}
	// A head cut inside a raster signature: the file stops before it could be anything else.
	if ([SIG.jpeg, SIG.png, SIG.tiffLE, SIG.tiffBE, SIG.riff].some((s) => isPrefixOf(head, s)) && head.length >= size) {
		return refuse('truncated', REASONS.truncatedHead);
	}

	if (startsWith(head, SIG.gif87) || startsWith(head, SIG.gif89)) return findMarkup(head) ? refuse('polyglot', REASONS.polyglotHead) : refuse('gif', REASONS.gif);
	if (startsWith(head, SIG.pdf)) return refuse('pdf', REASONS.pdf);
	if (ZIP_STARTS.some((z) => startsWith(head, z))) return refuse('zip', REASONS.zip);
	if (startsWith(head, SIG.elf) || MACHO.some((m) => startsWith(head, m))) return refuse('executable', REASONS.executable);
	if (startsWith(head, SIG.shebang)) return refuse('executable', 'This is a script, not a photograph.');
	if (plausibleBmp(head, size)) return findMarkup(head) ? refuse('polyglot', REASONS.polyglotHead) : refuse('bmp', REASONS.bmp);

	const text = asText(head);
	// "MZ" opens DOS/Windows programs; a text file that merely starts with those letters is text.
	if (head[0] === 0x4d && head[1] === 0x5a && text === null) return refuse('executable', REASONS.executable);
	// %PDF- may follow some junk; PDF readers look for it within the first kilobyte (from memory).
	if (indexOfAscii(head.subarray(0, 1024), PDF_IN_HEAD, false) >= 0) return refuse('pdf', REASONS.pdf);
	if (text !== null) return classifyText(text);
	return refuse('unknown', REASONS.unknown);
}

/**
 * After sniffHead said ok: does the file end where the format says it ends, with nothing smuggled
 * after it? `tail` is the last up-to-4096 bytes (it overlaps `head` for small files).
 */
export function checkEnd(kind: RasterKind, head: Uint8Array, tail: Uint8Array, fileSize: number): EndResult {
	// Things that only make sense at the end of some other kind of file, whatever the image format:
	// a zip's end-of-central-directory record (zip readers look for it from the end), a PDF's %%EOF
	// (PDF 1.7 §7.5.5, from memory), or the end of a web page.
	if (lastIndexOf(tail, SIG.zipEocd) >= 0) return { ok: false, code: 'polyglot', reason: 'A zip archive is attached to the end of this image, so it is not accepted.' };
	if (indexOfAscii(tail, '%%EOF', false) >= 0) return { ok: false, code: 'polyglot', reason: 'A PDF document is attached to the end of this image, so it is not accepted.' };
	if (indexOfAscii(tail, '</html', true) >= 0 || indexOfAscii(tail, '<script', true) >= 0) {
		return { ok: false, code: 'polyglot', reason: 'Web-page or script code is attached to the end of this image, so it is not accepted.' };
	}
	const after = { ok: false, code: 'polyglot', reason: 'There is data after the end of the image, so it is not accepted.' } as const;
	const cut = (name: string) => ({ ok: false, code: 'truncated', reason: `The ${name} file is incomplete (its end is missing); it was probably cut off while copying.` }) as const;

	switch (kind) {
		case 'jpeg': {
			// ISO/IEC 10918-1 B.2.1: the image ends with EOI (FF D9). Some writers pad with zero bytes
			// after it. A multi-picture (MPF/CIPA DC-007) file ends with its last image's EOI, so only the
			// very end is checked, never the first EOI.
			let end = tail.length;
			while (end > 0 && tail[end - 1] === 0x00) end--;
			if (end >= 2 && tail[end - 2] === 0xff && tail[end - 1] === 0xd9) return { ok: true };
			// An EOI earlier in the tail with something after it: data appended to a finished image.
			// (FF D9 cannot occur inside entropy-coded data, where FF is always followed by 00 or RSTn.)
			return lastIndexOf(tail.subarray(0, end), SIG.eoi) >= 0 ? after : cut('JPEG');
		}
		case 'png': {
			if (tail.length >= 12 && startsWith(tail, SIG.iend, tail.length - 12)) return { ok: true };
			return lastIndexOf(tail, SIG.iend) >= 0 ? after : cut('PNG');
		}
		case 'webp': {
			// RIFF/WebP container spec: the size at bytes 4–7 counts the bytes from offset 8 to the end.
			if (head.length < 8) return cut('WebP');
			const expected = u32le(head, 4) + 8;
			if (expected === fileSize) return { ok: true };
			return expected < fileSize ? after : cut('WebP');
		}
		default:
			// TIFF, HEIF and AVIF have no end marker: the IFDs or boxes point wherever they like. The decoder
			// finds a cut-off file; what follows the image data cannot be told from junk without parsing it.
			return { ok: true };
	}
}
