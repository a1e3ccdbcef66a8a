import { describe, expect, it } from 'vitest';
import { matchFileNames, objectNumberKey } from '../../../src/lib/photos/matching.ts';

const DEMO = ['STC.1898.014', 'STC.1898.015', 'STC.1898.01', 'STC.1898.0145', 'STC.1902.003', 'STC.1902.003a', 'NHM.2004.12.3'];
const one = (fileName: string, objectNumbers: string[] = DEMO) => matchFileNames([fileName], objectNumbers)[0]!;

describe('objectNumberKey', () => {
	it('case-folds and removes separators', () => {
		expect(objectNumberKey('STC.1898.014')).toBe('stc1898014');
		expect(objectNumberKey(' stc-1898 / 014 ')).toBe('stc1898014');
		expect(objectNumberKey('ＳＴＣ．１８９８．０１４')).toBe('stc1898014'); // full-width, NFKC
		expect(objectNumberKey('...')).toBe('');
	});
});

describe('matchFileNames: the photographers’ ways of writing STC.1898.014', () => {
	it.each([
		'STC.1898.014_front.jpg',
		'STC-1898-014 lid.JPG',
		'stc_1898_014-2.tif',
		'STC1898.014.jpeg',
		'STC 1898 014.png',
		'2026-03-15_STC.1898.014_before-treatment.jpg',
		'Condition check/STC.1898.014/IMG STC.1898.014.webp',
		'C:\\Photos\\STC.1898.014 (2).jpg',
		'STC.1898.014',
	])('%s', (name) => {
		expect(one(name)).toEqual({ fileName: name, objectNumber: 'STC.1898.014', candidates: ['STC.1898.014'], how: 'exact' });
	});
});

describe('matchFileNames: token boundaries', () => {
	it('a shorter number does not match inside a longer token', () => {
		// STC.1898.01 is in the list; it must not match here, and STC.1898.014 must win.
		expect(one('STC.1898.014_front.jpg').objectNumber).toBe('STC.1898.014');
		expect(one('STC.1898.0145.jpg')).toMatchObject({ objectNumber: 'STC.1898.0145', how: 'exact' });
		expect(one('STC.1898.0145.jpg', ['STC.1898.014'])).toMatchObject({ objectNumber: null, how: 'none' });
		expect(one('STC.1898.014_front.jpg', ['STC.1898.01'])).toMatchObject({ objectNumber: null, how: 'none' });
		expect(one('XSTC.1898.014.jpg', ['STC.1898.014'])).toMatchObject({ how: 'none' });
	});
	it('the longest matching object number wins', () => {
		expect(one('STC.1902.003a_label.jpg')).toMatchObject({ objectNumber: 'STC.1902.003a', how: 'exact' });
		expect(one('STC.1902.003_label.jpg')).toMatchObject({ objectNumber: 'STC.1902.003', how: 'exact' });
		expect(one('STC.1902.003a')).toMatchObject({ objectNumber: 'STC.1902.003a', how: 'exact' }); // no extension
		expect(one('STC.1898.014.jpg', ['STC.1898', 'STC.1898.014'])).toMatchObject({ objectNumber: 'STC.1898.014' });
		expect(one('STC.1898_overview.jpg', ['STC.1898', 'STC.1898.014'])).toMatchObject({ objectNumber: 'STC.1898', how: 'exact' });
	});
	it('digits written together are one token: no guessing where the dots were', () => {
		expect(one('STC1898014.jpg')).toMatchObject({ how: 'none' });
	});
	it('camera names and other files do not match', () => {
		expect(one('IMG_4821.JPG')).toEqual({ fileName: 'IMG_4821.JPG', objectNumber: null, candidates: [], how: 'none' });
		expect(one('DSC00014.ARW')).toMatchObject({ how: 'none' });
		expect(one('.jpg')).toMatchObject({ how: 'none' });
		expect(one('')).toMatchObject({ how: 'none' });
	});
	it('a four-part number with letters in it', () => {
		expect(one('nhm-2004-12-3_jar.tiff')).toMatchObject({ objectNumber: 'NHM.2004.12.3', how: 'exact' });
		expect(one('NHM 2004.12.30.tiff')).toMatchObject({ how: 'none' });
	});
});

describe('matchFileNames: leading zeros', () => {
	it('may be dropped when that gives one match and no exact one exists', () => {
		expect(one('STC.1898.14_front.jpg')).toEqual({ fileName: 'STC.1898.14_front.jpg', objectNumber: 'STC.1898.014', candidates: ['STC.1898.014'], how: 'normalised' });
		expect(one('STC.1902.3a.jpg')).toMatchObject({ objectNumber: 'STC.1902.003a', how: 'normalised' });
		expect(one('STC.1898.0014.jpg', ['STC.1898.014'])).toMatchObject({ objectNumber: 'STC.1898.014', how: 'normalised' });
	});
	it('count when an exact match exists', () => {
		const list = ['STC.1898.014', 'STC.1898.14'];
		expect(one('STC.1898.14.jpg', list)).toMatchObject({ objectNumber: 'STC.1898.14', how: 'exact' });
		expect(one('STC.1898.014.jpg', list)).toMatchObject({ objectNumber: 'STC.1898.014', how: 'exact' });
	});
	it('give ambiguity when two numbers differ only in leading zeros and neither is exact', () => {
		expect(one('STC.1898.0014.jpg', ['STC.1898.014', 'STC.1898.14'])).toEqual({
			fileName: 'STC.1898.0014.jpg',
			objectNumber: null,
			candidates: ['STC.1898.014', 'STC.1898.14'],
			how: 'ambiguous',
		});
	});
	it('a zero on its own stays a zero', () => {
		expect(one('A.0.jpg', ['A.0', 'A.00'])).toMatchObject({ objectNumber: 'A.0', how: 'exact' });
		expect(one('A.000.jpg', ['A.0'])).toMatchObject({ objectNumber: 'A.0', how: 'normalised' });
	});
});

describe('matchFileNames: ambiguity', () => {
	it('two object numbers in one file name', () => {
		expect(one('STC.1898.014 and STC.1898.015 side by side.jpg')).toEqual({
			fileName: 'STC.1898.014 and STC.1898.015 side by side.jpg',
			objectNumber: null,
			candidates: ['STC.1898.014', 'STC.1898.015'],
			how: 'ambiguous',
		});
	});
	it('two object numbers in the list that only differ in punctuation or case', () => {
		expect(one('STC.1898.014.jpg', ['STC-1898-014', 'stc.1898.014'])).toMatchObject({ how: 'ambiguous', candidates: ['STC-1898-014', 'stc.1898.014'] });
	});
	it('the same number twice in the list is one candidate', () => {
		expect(one('STC.1898.014.jpg', ['STC.1898.014', 'STC.1898.014'])).toMatchObject({ how: 'exact', candidates: ['STC.1898.014'] });
	});
	it('the same number twice in the name is one match', () => {
		expect(one('STC.1898.014/STC.1898.014_front.jpg')).toMatchObject({ how: 'exact', objectNumber: 'STC.1898.014' });
	});
});

describe('matchFileNames: other scripts and forms', () => {
	it('letters outside ASCII are letters, and decomposed accents (macOS) are recomposed', () => {
		const list = ['Müller.12', 'Ψ.7'];
		expect(one('mu\u0308ller_12.jpg', list)).toMatchObject({ objectNumber: 'Müller.12', how: 'exact' });
		expect(one('ψ-7 front.jpg', list)).toMatchObject({ objectNumber: 'Ψ.7', how: 'exact' });
	});
	it('keeps the order of the files given', () => {
		const names = ['IMG_4821.JPG', 'STC.1898.015.jpg', 'STC.1898.014.jpg'];
		expect(matchFileNames(names, DEMO).map((m) => [m.fileName, m.objectNumber])).toEqual([
			['IMG_4821.JPG', null],
			['STC.1898.015.jpg', 'STC.1898.015'],
			['STC.1898.014.jpg', 'STC.1898.014'],
		]);
	});
});

describe('matchFileNames: a large collection', () => {
	it('matches 500 files against 10,000 object numbers (an index, not a scan of the list per file)', () => {
		const objectNumbers: string[] = [];
		for (let y = 1890; y < 1910; y++) for (let n = 1; n <= 500; n++) objectNumbers.push(`STC.${y}.${String(n).padStart(3, '0')}`);
		expect(objectNumbers).toHaveLength(10_000);
		const files: string[] = [];
		for (let i = 0; i < 500; i++) {
			const y = 1890 + (i % 20);
			const n = 1 + ((i * 37) % 500);
			files.push(i % 5 === 0 ? `IMG_${4000 + i}.JPG` : `stc_${y}_${String(n).padStart(3, '0')}-${i % 3}.tif`);
		}
		const result = matchFileNames(files, objectNumbers);
		expect(result).toHaveLength(500);
		expect(result.filter((r) => r.how === 'none')).toHaveLength(100);
		expect(result.filter((r) => r.how === 'exact')).toHaveLength(400);
		expect(result[1]).toMatchObject({ fileName: 'stc_1891_038-1.tif', objectNumber: 'STC.1891.038' });
	});
});
