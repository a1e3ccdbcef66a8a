import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inspect, isDecodeError, makeDerivatives, readExif, shortError } from '../../src/lib/server/photos/pipeline.ts';
import { sampleJpeg } from '../helpers/photos.ts';

/**
 * TESTPLAN B3, a malformed corpus (sharp and exifr on untrusted input; ASVS 5.0 16.5.4 errors
 * handled, 16.5.1 generic messages): 10,000 damaged photographs (bits flipped, bytes overwritten or
 * inserted, files cut short, the EXIF block scrambled), 2,500 from each accepted format, go through
 * exactly what the photo worker does with an upload: inspect the bytes and header, read the EXIF,
 * decode and make the derivatives. Pass: each one is either made into derivatives or refused with one
 * of the known reasons, in words that name no server path; a decoder failure is always recognised as
 * "this file is bad" (never taken for a machine fault, which the worker would retry eight times); no
 * crash. fast-check shrinks a failure to the smallest damage that shows it (seed printed).
 */
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'meniscus-malformed-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

const PER_FORMAT = Number(process.env.MENISCUS_MALFORMED_RUNS ?? 2_500);
const KNOWN = new Set(['empty', 'text', 'html', 'svg', 'xml', 'pdf', 'zip', 'gif', 'bmp', 'program', 'unknown', 'truncated', 'polyglot', 'heic', 'not-accepted', 'unreadable', 'mismatch', 'too-many-pixels']);

type Damage =
	| { kind: 'flip'; at: number[]; bits: number[] }
	| { kind: 'overwrite'; at: number; bytes: Uint8Array }
	| { kind: 'insert'; at: number; bytes: Uint8Array }
	| { kind: 'cut'; at: number }
	| { kind: 'exif'; at: number; bytes: Uint8Array };

const damage: fc.Arbitrary<Damage> = fc.oneof(
	fc.record({ kind: fc.constant('flip' as const), at: fc.array(fc.nat(), { minLength: 1, maxLength: 8 }), bits: fc.array(fc.integer({ min: 0, max: 7 }), { minLength: 8, maxLength: 8 }) }),
	fc.record({ kind: fc.constant('overwrite' as const), at: fc.nat(), bytes: fc.uint8Array({ minLength: 1, maxLength: 64 }) }),
	fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), bytes: fc.uint8Array({ minLength: 1, maxLength: 64 }) }),
	fc.record({ kind: fc.constant('cut' as const), at: fc.nat() }),
	fc.record({ kind: fc.constant('exif' as const), at: fc.nat(), bytes: fc.uint8Array({ minLength: 4, maxLength: 48 }) }),
);

/** Where the EXIF (TIFF) block is in a file: after "Exif\0\0" in JPEG/WebP, the whole header in TIFF. */
function exifRange(b: Buffer): [number, number] {
	const at = b.indexOf('Exif\0\0');
	if (at >= 0) return [at + 6, Math.min(b.length, at + 6 + 400)];
	return [0, Math.min(b.length, 400)];
}

function damaged(seed: Buffer, d: Damage): Buffer {
	const b = Buffer.from(seed);
	switch (d.kind) {
		case 'flip':
			d.at.forEach((p, i) => (b[p % b.length]! ^= 1 << d.bits[i]!));
			return b;
		case 'overwrite':
			b.set(d.bytes.subarray(0, Math.max(0, b.length - (d.at % b.length))), d.at % b.length);
			return b;
		case 'insert':
			return Buffer.concat([b.subarray(0, d.at % b.length), d.bytes, b.subarray(d.at % b.length)]);
		case 'cut':
			return b.subarray(0, d.at % b.length);
		case 'exif': {
			const [lo, hi] = exifRange(b);
			const at = lo + (d.at % Math.max(1, hi - lo));
			b.set(d.bytes.subarray(0, Math.max(0, b.length - at)), at);
			return b;
		}
	}
}

const exif = { IFD0: { Make: 'Invented Optics', Model: 'Survey 1', Software: 'seed', DateTime: '2026:11:20 10:12:00' } };
let seeds: [string, Buffer][] = [];

beforeAll(async () => {
	const base = sharp(await sampleJpeg(72, 48));
	seeds = [
		['jpeg', await sampleJpeg(72, 48, exif)],
		['png', await base.clone().png().toBuffer()],
		['tiff', await base.clone().withExif(exif).tiff().toBuffer()],
		['webp', await base.clone().withExif(exif).webp({ quality: 80 }).toBuffer()],
	];
});

let n = 0;
const tally = { made: 0, refused: 0, undecodable: 0 };

/** What the worker does with one file; throws only for what the worker would not handle. */
async function asTheWorkerWould(bytes: Buffer): Promise<void> {
	const file = path.join(tmp, `m-${n++}`);
	fs.writeFileSync(file, bytes);
	try {
		const seen = await inspect(file);
		if (!seen.ok) {
			if (!KNOWN.has(seen.refusal.code)) throw new Error(`unknown refusal code ${seen.refusal.code}`);
			if (seen.refusal.reason.includes(tmp) || seen.refusal.reason.includes(os.tmpdir())) throw new Error(`a refusal names a server path: ${seen.refusal.reason}`);
			tally.refused++;
			return;
		}
		await readExif(file); // never throws: unreadable EXIF is empty EXIF
		try {
			const made = await makeDerivatives(file, `${file}-set`);
			if (made.length !== 3) throw new Error(`made ${made.length} derivatives`);
			tally.made++;
		} catch (err) {
			if (!isDecodeError(err)) throw new Error(`a decoder failure not recognised as a bad file (the worker would retry it): ${shortError(err)}`);
			if (shortError(err).includes(tmp)) throw new Error(`the refusal would name a server path: ${shortError(err)}`);
			tally.undecodable++;
		}
	} finally {
		fs.rmSync(file, { force: true });
		fs.rmSync(`${file}-set`, { recursive: true, force: true });
	}
}

describe('a corpus of damaged photographs through the worker’s pipeline (TESTPLAN B3)', () => {
	it.each(['jpeg', 'png', 'tiff', 'webp'])('%s: every damaged file is made, or refused for a known reason; nothing crashes', async (format) => {
		const seed = seeds.find(([f]) => f === format)![1];
		const before = { ...tally };
		await fc.assert(
			fc.asyncProperty(damage, async (d) => asTheWorkerWould(damaged(seed, d))),
			{ numRuns: PER_FORMAT, seed: 20261202 + format.length, endOnFailure: false },
		);
		console.log(`[B3 ${format}] ${PER_FORMAT} damaged files: ${tally.made - before.made} still made, ${tally.refused - before.refused} refused on inspection, ${tally.undecodable - before.undecodable} refused as undecodable`);
	}, 600_000);
});
