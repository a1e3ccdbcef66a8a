/**
 * Which specimen a dropped photograph belongs to, from the object number in its file name.
 *
 * Collections write object numbers differently (STC.1898.014, 1898-14a, NHM 2004.12.3), so an object
 * number is read as a sequence of tokens: runs of letters and runs of digits, with punctuation,
 * spaces and the change between letters and digits as boundaries. Photographers write the same
 * number as `STC.1898.014_front.jpg`, `STC-1898-014 lid.JPG`, `stc_1898_014-2.tif` or
 * `STC1898.014.jpeg`; all four have the tokens stc · 1898 · 014.
 *
 * A match must cover whole tokens, so STC.1898.01 never matches `STC.1898.014_front` and STC.1898.014
 * never matches `STC.1898.0145`. Digits written together are one token: `STC1898014` does not match
 * STC.1898.014, because where the boundaries fall cannot be known (it could be STC.18.98014).
 *
 * How a match was made:
 * - 'exact': the tokens are the object number's tokens (case and separators ignored);
 * - 'normalised': equal only once leading zeros are dropped from numeric tokens (a file
 *   `STC.1898.14` for STC.1898.014), used only where no exact match of that length exists;
 * - 'ambiguous': two or more object numbers match equally well; nothing is chosen;
 * - 'none'.
 * Longer matches (more tokens) win over shorter ones, so STC.1898.014 beats STC.1898 when both exist.
 *
 * Object numbers are indexed once in Maps keyed by their token sequence; each file then looks up
 * every run of its own tokens, so the cost is about (files × tokens per name × longest object
 * number in tokens), independent of how many object numbers there are.
 */

export interface FileMatch {
	fileName: string;
	objectNumber: string | null;
	candidates: string[];
	how: 'exact' | 'normalised' | 'none' | 'ambiguous';
}

/** Letters (any script) or decimal digits, after NFKC (full-width digits become ASCII; macOS's
 * decomposed accents are recomposed so that "Müller" stays one token). */
const TOKEN = /\p{L}+|\p{Nd}+/gu;
const DIGITS = /^\p{Nd}+$/u;
/** Longest object number considered, in tokens; keeps a pathological list from slowing every file. */
const MAX_TOKENS = 24;

function tokens(s: string): string[] {
	return s.normalize('NFKC').toLowerCase().match(TOKEN) ?? [];
}
const stripZeros = (t: string) => (DIGITS.test(t) ? t.replace(/^0+(?=\d)/u, '') : t);
// A separator that cannot occur inside a token, so joined keys keep their boundaries.
const join = (ts: readonly string[]) => ts.join('\u0000');

/** Case-folded, separators removed: 'STC.1898.014' → 'stc1898014'. For display and duplicate hints;
 * matching itself keeps the token boundaries (see above). */
export function objectNumberKey(s: string): string {
	return tokens(s).join('');
}

/** The file name without folders and without its extension: a final dot part of up to five
 * letters and digits starting with a letter (jpg, tiff, cr2), so `STC.1898.014` and `STC.1902.003a`
 * keep their last part while `STC.1898.014.jpeg` loses `.jpeg`. */
function baseName(fileName: string): string {
	const name = fileName.slice(Math.max(fileName.lastIndexOf('/'), fileName.lastIndexOf('\\')) + 1);
	return name.replace(/\.\p{L}[\p{L}\p{Nd}]{0,4}$/u, '');
}

interface Index {
	exact: Map<string, string[]>;
	normalised: Map<string, string[]>;
	longest: number;
}

function buildIndex(objectNumbers: readonly string[]): Index {
	const exact = new Map<string, string[]>();
	const normalised = new Map<string, string[]>();
	let longest = 0;
	const add = (m: Map<string, string[]>, k: string, v: string) => {
		const list = m.get(k);
		if (!list) m.set(k, [v]);
		else if (!list.includes(v)) list.push(v);
	};
	for (const on of objectNumbers) {
		const ts = tokens(on);
		if (ts.length === 0 || ts.length > MAX_TOKENS) continue;
		longest = Math.max(longest, ts.length);
		add(exact, join(ts), on);
		add(normalised, join(ts.map(stripZeros)), on);
	}
	return { exact, normalised, longest };
}

function matchOne(fileName: string, index: Index, order: Map<string, number>): FileMatch {
	const ts = tokens(baseName(fileName));
	const norm = ts.map(stripZeros);
	const byOrder = (a: string, b: string) => (order.get(a) ?? 0) - (order.get(b) ?? 0);
	for (let len = Math.min(index.longest, ts.length); len >= 1; len--) {
		const exact = new Set<string>();
		const normalised = new Set<string>();
		for (let i = 0; i + len <= ts.length; i++) {
			for (const on of index.exact.get(join(ts.slice(i, i + len))) ?? []) exact.add(on);
			for (const on of index.normalised.get(join(norm.slice(i, i + len))) ?? []) normalised.add(on);
		}
		// Leading zeros count when they decide: an exact match of this length beats normalised ones.
		const found = exact.size ? exact : normalised;
		if (found.size === 0) continue;
		const candidates = [...found].sort(byOrder);
		if (candidates.length > 1) return { fileName, objectNumber: null, candidates, how: 'ambiguous' };
		return { fileName, objectNumber: candidates[0]!, candidates, how: exact.size ? 'exact' : 'normalised' };
	}
	return { fileName, objectNumber: null, candidates: [], how: 'none' };
}

/** One result per file name, in the order given. */
export function matchFileNames(fileNames: string[], objectNumbers: string[]): FileMatch[] {
	const index = buildIndex(objectNumbers);
	const order = new Map<string, number>();
	objectNumbers.forEach((on, i) => {
		if (!order.has(on)) order.set(on, i);
	});
	return fileNames.map((name) => matchOne(name, index, order));
}
