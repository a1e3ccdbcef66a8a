import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ANNO_CONTEXT, AnnotationImportError, exportAnnotations, importAnnotations, IMPORT_DEFAULTS } from '../../../src/lib/marks/annotation.ts';
import { MarkLayerSchema, type MarkLayer } from '../../../src/lib/marks/schema.ts';

const alice = '6f1c2a8e-3b4d-4e5f-8a9b-0c1d2e3f4a5b';
const bob = '0b7e5c1d-9a2f-4c3e-b8d7-6a5f4e3d2c1b';
const t0 = '2026-12-04T10:00:00Z';
const t1 = '2026-12-04T11:30:00.250Z';
const common = { authorId: alice, createdAt: t0, updatedAt: t1 };
const imageId = 'https://meniscus.example/iiif/3/photo-7f3a';
const options = { imageId, width: 6000, height: 4000 };

/** One mark of every kind, fractional and negative coordinates, a note with a newline, and comments. */
const layer: MarkLayer = MarkLayerSchema.parse({
	schemaVersion: 1,
	marks: [
		{ ...common, id: 'crack-1', kind: 'outline', part: 'container', term: 'cracked', severity: 3, note: 'Runs from the shoulder\nto the base.', points: [[100.5, 200.25], [400, 210], [390.125, 600], [-3, 580]] },
		{ ...common, id: 'thread', kind: 'path', part: 'mount', term: 'slack thread', severity: 1, note: '', points: [[1000, 1000], [1100, 1050.5], [1200, 990]] },
		{ ...common, id: 'mould', kind: 'pin', part: 'specimen', term: 'mould', severity: 2, note: 'White, fluffy.', at: [2500.75, 1800] },
		{ ...common, authorId: bob, id: 'lbl', kind: 'box', part: 'label', term: 'faded', severity: 2, note: '', x: 3000, y: 3200, w: 640.5, h: 300 },
		{ ...common, id: 'scale', kind: 'scale', from: [50, 3900], to: [650, 3900], lengthMm: 100 },
		{ ...common, id: 'grey', kind: 'grey', x: 5500, y: 3500, w: 400, h: 400 },
		{ ...common, id: 'fluid', kind: 'level', level: 'fluid-line', from: [800, 700], to: [5200, 690] },
		{ ...common, id: 'top', kind: 'level', level: 'specimen-top', from: [800, 900], to: [5200, 905] },
		{ ...common, id: 'base', kind: 'level', level: 'inner-base', from: [800, 3700], to: [5200, 3700] },
		{ ...common, id: 'cp-1', kind: 'control', n: 1, at: [120, 130] },
	],
	comments: [
		{ id: 'c1', markId: 'crack-1', authorId: bob, text: 'Is this the crack from the 2019 loan?', createdAt: '2026-12-05T09:00:00Z' },
		{ id: 'c2', markId: 'crack-1', authorId: alice, text: 'Yes, it has grown.', createdAt: '2026-12-05T09:10:00Z' },
		{ id: 'c3', markId: 'scale', authorId: bob, text: 'Ruler was outside the jar.', createdAt: '2026-12-05T09:20:00Z' },
	],
});

/** Errors the importer is allowed to throw: its own, never a TypeError from reading a bad shape. */
function importError(input: unknown): unknown {
	try {
		importAnnotations(input, { now: t0 });
	} catch (e) {
		return e;
	}
	return null;
}

describe('exportAnnotations', () => {
	const page = exportAnnotations(layer, { ...options, creatorName: (id) => (id === alice ? 'A. Conservator' : undefined) });

	it('writes an AnnotationPage with the Web Annotation context and our own', () => {
		// W3C Web Annotation Data Model (2017), §5.2 Annotation Page and §3.1 (the anno.jsonld context).
		expect(page['@context'][0]).toBe('http://www.w3.org/ns/anno.jsonld');
		expect(page['@context'][0]).toBe(ANNO_CONTEXT);
		expect(page['@context'][1]).toMatchObject({ meniscus: expect.stringMatching(/#$/), 'meniscus:mark': { '@type': '@json' } });
		expect(page.type).toBe('AnnotationPage');
		expect(page.id).toBe(`${imageId}/annotations`);
		expect(page.items).toHaveLength(layer.marks.length + layer.comments.length);
	});

	it('gives every annotation the properties the Data Model requires', () => {
		// Data Model §3.1: an Annotation MUST have an id and a type of "Annotation", and 1 or more targets;
		// it SHOULD have a body, here with a motivation (§3.3.5).
		const ids = new Set<string>();
		for (const a of page.items) {
			expect(a.type).toBe('Annotation');
			expect(a.id).toMatch(/^https:\/\//);
			ids.add(a.id);
			expect(a.target).toBeDefined();
			expect(a.body.length).toBeGreaterThan(0);
			expect(['tagging', 'describing', 'commenting']).toContain(a.motivation);
			for (const b of a.body) expect(b).toMatchObject({ type: 'TextualBody', format: 'text/plain', value: expect.any(String) });
		}
		expect(ids.size).toBe(page.items.length);
	});

	it('targets the photo with an SVG selector in photo pixels, one SVG element per kind', () => {
		// Data Model §4 SpecificResource with source, §4.2.8 SvgSelector with the SVG as `value`.
		const byId = new Map(page.items.map((a) => [a.id.split('/').pop(), a]));
		const svgOf = (id: string) => {
			const t = byId.get(id)!.target;
			if (typeof t === 'string') throw new Error('expected a SpecificResource');
			expect(t).toMatchObject({ type: 'SpecificResource', source: imageId, selector: { type: 'SvgSelector' } });
			expect(t.selector.value).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg" width="6000" height="4000">/);
			return t.selector.value;
		};
		expect(svgOf('crack-1')).toContain('<polygon points="100.5,200.25 400,210 390.125,600 -3,580"/>');
		expect(svgOf('thread')).toContain('<polyline points="1000,1000 1100,1050.5 1200,990" fill="none"/>');
		expect(svgOf('mould')).toMatch(/<circle cx="2500.75" cy="1800" r="\d+"\/>/);
		expect(svgOf('lbl')).toContain('<rect x="3000" y="3200" width="640.5" height="300"/>');
		expect(svgOf('scale')).toContain('<line x1="50" y1="3900" x2="650" y2="3900"/>');
		expect(svgOf('grey')).toContain('<rect');
		expect(svgOf('fluid')).toContain('<line');
		expect(svgOf('cp-1')).toContain('<circle');
	});

	it('tags damage with its term and describes the note, part and severity in words', () => {
		const crack = page.items[0]!;
		expect(crack.motivation).toBe('tagging');
		expect(crack.body).toEqual([
			{ type: 'TextualBody', value: 'cracked', format: 'text/plain', purpose: 'tagging', language: 'en' },
			{ type: 'TextualBody', value: 'Container', format: 'text/plain', purpose: 'classifying', language: 'en' },
			{ type: 'TextualBody', value: 'Severity 3 of 3 (severe)', format: 'text/plain', purpose: 'assessing', language: 'en' },
			{ type: 'TextualBody', value: 'Runs from the shoulder\nto the base.', format: 'text/plain', purpose: 'describing' },
		]);
		expect(crack['meniscus:mark']).toEqual({ kind: 'outline', id: 'crack-1', part: 'container', severity: 3, authorId: alice, createdAt: t0, updatedAt: t1 });
		expect(crack.creator).toEqual({ id: `urn:uuid:${alice}`, type: 'Person', name: 'A. Conservator' });
		expect(page.items[3]!.creator).toEqual({ id: `urn:uuid:${bob}`, type: 'Person' });
		expect(crack.created).toBe(t0);
		expect(crack.modified).toBe(t1);
	});

	it('describes measurement marks', () => {
		const scale = page.items.find((a) => a.id.endsWith('/scale'))!;
		expect(scale.motivation).toBe('describing');
		expect(scale.body[0]!.value).toBe('Scale bar, 100 mm');
		expect(scale['meniscus:mark']).toMatchObject({ kind: 'scale', lengthMm: 100 });
		expect(page.items.find((a) => a.id.endsWith('/fluid'))!.body[0]!.value).toBe('Fluid line');
		expect(page.items.find((a) => a.id.endsWith('/cp-1'))!['meniscus:mark']).toMatchObject({ kind: 'control', n: 1 });
	});

	it('exports comments as commenting annotations on the mark’s annotation', () => {
		const c1 = page.items.find((a) => a.id.endsWith('/comments/c1'))!;
		expect(c1).toMatchObject({ motivation: 'commenting', target: `${imageId}/annotations/crack-1`, created: '2026-12-05T09:00:00Z' });
		expect(c1.body).toEqual([{ type: 'TextualBody', value: 'Is this the crack from the 2019 loan?', format: 'text/plain', purpose: 'commenting' }]);
		expect(page.items.map((a) => a.id)).toContain(c1.target);
	});

	it('refuses to export without an image id or size', () => {
		expect(() => exportAnnotations(layer, { ...options, imageId: ' ' })).toThrow(/image id/);
		expect(() => exportAnnotations(layer, { ...options, width: 0 })).toThrow(/width/);
	});
});

describe('importAnnotations of our own export', () => {
	it('gives back the same layer, through JSON text too, without warnings', () => {
		const page = exportAnnotations(layer, options);
		expect(importAnnotations(page)).toEqual({ layer, warnings: [] });
		expect(importAnnotations(JSON.stringify(page))).toEqual({ layer, warnings: [] });
	});

	it('gives back an empty layer', () => {
		const empty = MarkLayerSchema.parse({ schemaVersion: 1, marks: [] });
		expect(importAnnotations(exportAnnotations(empty, options)).layer).toEqual(empty);
	});

	it('round-trips any coordinates exactly', () => {
		// JSON has no −0 (ECMA-404 numbers; JSON.stringify(-0) is "0"), nor has the stored layer: add 0 to drop it.
		const coord = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }).map((v) => v + 0);
		fc.assert(
			fc.property(fc.array(fc.tuple(coord, coord), { minLength: 3, maxLength: 12 }), fc.tuple(coord, coord), (points, at) => {
				const l = MarkLayerSchema.parse({
					schemaVersion: 1,
					marks: [
						{ ...common, id: 'o', kind: 'outline', part: 'seal', term: 'perished', severity: 2, points },
						{ ...common, id: 'p', kind: 'pin', part: 'fluid', term: 'cloudy', severity: 1, at },
					],
				});
				expect(importAnnotations(JSON.parse(JSON.stringify(exportAnnotations(l, options)))).layer).toEqual(l);
			}),
			{ numRuns: 200 },
		);
	});

	it('follows an edit made in another tool to the shape or the note', () => {
		const page = exportAnnotations(layer, options);
		const crack = page.items[0]!;
		if (typeof crack.target !== 'string') crack.target.selector.value = crack.target.selector.value.replace('-3,580', '10,580');
		crack.body[3]!.value = 'Edited elsewhere.';
		const back = importAnnotations(page).layer.marks[0]!;
		expect(back).toMatchObject({ note: 'Edited elsewhere.', points: [[100.5, 200.25], [400, 210], [390.125, 600], [10, 580]] });
	});

	it('refuses a page written by a newer Meniscus', () => {
		const page = { ...exportAnnotations(layer, options), 'meniscus:layer': { schemaVersion: 3 } };
		expect(() => importAnnotations(page)).toThrow('These annotations were written by a newer Meniscus (version 3); this server reads up to version 1.');
	});
});

describe('importAnnotations of foreign annotations', () => {
	it('imports an annotation with only an SVG polygon selector as an outline, with defaults and a warning', () => {
		// Shape of the Data Model's SvgSelector example (§4.2.8, from memory), with a real polygon.
		const foreign = {
			'@context': 'http://www.w3.org/ns/anno.jsonld',
			id: 'http://example.org/anno23',
			type: 'Annotation',
			target: {
				source: 'http://example.org/map1',
				selector: { type: 'SvgSelector', value: '<svg:svg xmlns:svg="http://www.w3.org/2000/svg"><svg:polygon points="10,10 200,10 200,150"/></svg:svg>' },
			},
		};
		const { layer: l, warnings } = importAnnotations(foreign, { authorId: bob, now: t0 });
		expect(l.marks).toEqual([
			{ id: 'anno23', kind: 'outline', points: [[10, 10], [200, 10], [200, 150]], part: IMPORT_DEFAULTS.part, term: IMPORT_DEFAULTS.term, severity: IMPORT_DEFAULTS.severity, note: '', authorId: bob, createdAt: t0, updatedAt: t0 },
		]);
		expect(warnings).toEqual([
			'Annotation http://example.org/anno23: imported as an outline; it did not give its part, term and severity, so it has part Container, term "unclassified" and severity 1 (minor) until someone reviews it.',
		]);
	});

	it('reads tags, part, severity and descriptions from a foreign annotation’s bodies', () => {
		const foreign = {
			id: 'urn:x:7',
			type: 'Annotation',
			motivation: 'tagging',
			created: '2015-01-31T12:03:45+01:00',
			creator: { id: `urn:uuid:${alice}`, type: 'Person' },
			body: [
				{ type: 'TextualBody', value: 'Lid', purpose: 'classifying' },
				{ type: 'TextualBody', value: 'corroded' },
				{ type: 'TextualBody', value: 'severe', purpose: 'assessing' },
				{ type: 'TextualBody', value: 'Green deposits at the rim.', purpose: 'describing' },
			],
			target: { source: imageId, selector: { type: 'SvgSelector', value: '<svg><rect x="5" y="6" width="70" height="80"/></svg>' } },
		};
		const { layer: l, warnings } = importAnnotations([foreign]);
		expect(l.marks[0]).toEqual({ id: '7', kind: 'box', x: 5, y: 6, w: 70, h: 80, part: 'lid', term: 'corroded', severity: 3, note: 'Green deposits at the rim.', authorId: alice, createdAt: '2015-01-31T11:03:45.000Z', updatedAt: '2015-01-31T11:03:45.000Z' });
		expect(warnings).toEqual(['Annotation urn:x:7: imported as a box.']);
	});

	it('reads a FragmentSelector region and an #xywh= target as boxes', () => {
		// Data Model §4.2.1 FragmentSelector conforming to Media Fragments URI 1.0 §4.2.2, xywh=x,y,w,h (from memory).
		const page = {
			type: 'AnnotationPage',
			items: [
				{ id: 'a1', type: 'Annotation', target: { source: imageId, selector: { type: 'FragmentSelector', conformsTo: 'http://www.w3.org/TR/media-frags/', value: 'xywh=50,50,640,480' } } },
				{ id: 'a2', type: 'Annotation', motivation: 'commenting', bodyValue: 'Chip here?', target: `${imageId}#xywh=pixel:10,20,30,40` },
			],
		};
		const { layer: l } = importAnnotations(page, { now: t0, authorId: bob });
		expect(l.marks.map((m) => (m.kind === 'box' ? [m.x, m.y, m.w, m.h, m.note] : m.kind))).toEqual([
			[50, 50, 640, 480, ''],
			[10, 20, 30, 40, 'Chip here?'],
		]);
	});

	it('reads an SVG path: straight segments exactly, curves by their end points, with a warning', () => {
		const svg = (d: string) => ({ id: 'p', type: 'Annotation', target: { source: imageId, selector: { type: 'SvgSelector', value: `<svg><path d="${d}"/></svg>` } } });
		const closed = importAnnotations(svg('M10,10 L100,10 l0,90 H10 z'), { now: t0, authorId: bob });
		expect(closed.layer.marks[0]).toMatchObject({ kind: 'outline', points: [[10, 10], [100, 10], [100, 100], [10, 100]] });
		const curve = importAnnotations(svg('M0 0 C 10 10 20 10 30 0 L 60 0'), { now: t0, authorId: bob });
		expect(curve.layer.marks[0]).toMatchObject({ kind: 'path', points: [[0, 0], [30, 0], [60, 0]] });
		expect(curve.warnings.join(' ')).toMatch(/curves were imported as straight lines/);
	});

	it('names no author when none is given, and says so', () => {
		const { layer: l, warnings } = importAnnotations({ type: 'Annotation', target: { source: imageId, selector: { type: 'SvgSelector', value: '<svg><circle cx="4" cy="5" r="3"/></svg>' } } }, { now: t0 });
		expect(l.marks[0]).toMatchObject({ kind: 'pin', at: [4, 5], authorId: '00000000-0000-0000-0000-000000000000' });
		expect(warnings[0]).toMatch(/names no Meniscus user/);
	});

	it('keeps a crossing outline with a warning, for someone to redraw', () => {
		const bowTie = { id: 'b', type: 'Annotation', target: { source: imageId, selector: { type: 'SvgSelector', value: '<svg><polygon points="0,0 10,10 10,0 0,10"/></svg>' } } };
		const { layer: l, warnings } = importAnnotations(bowTie, { now: t0, authorId: bob });
		expect(l.marks).toHaveLength(1);
		expect(warnings.join(' ')).toMatch(/the outline crosses itself between points 1–2 and 3–4; it was kept for you to redraw/);
	});

	it('leaves out what it cannot read, one warning each, and imports the rest', () => {
		const ok = { id: 'ok', type: 'Annotation', target: { source: imageId, selector: { type: 'SvgSelector', value: '<svg><polygon points="0,0 10,0 0,10"/></svg>' } } };
		const page = {
			type: 'AnnotationPage',
			items: [
				ok,
				{ id: 'whole', type: 'Annotation', target: imageId },
				{ id: 'text', type: 'Annotation', target: { source: imageId, selector: { type: 'TextQuoteSelector', exact: 'anno' } } },
				{ id: 'pct', type: 'Annotation', target: { source: imageId, selector: { type: 'FragmentSelector', value: 'xywh=percent:10,10,5,5' } } },
				{ id: 'unit', type: 'Annotation', target: { source: imageId, selector: { type: 'SvgSelector', value: '<svg><rect x="1cm" y="0" width="5" height="5"/></svg>' } } },
				{ id: 'orphan', type: 'Annotation', motivation: 'commenting', bodyValue: 'Hm', target: 'http://elsewhere.example/anno/9' },
				{ id: 'notanno', type: 'Highlight' },
				'just a string',
			],
		};
		const { layer: l, warnings } = importAnnotations(page, { now: t0, authorId: bob });
		expect(l.marks.map((m) => m.id)).toEqual(['ok']);
		expect(warnings.filter((w) => w.includes('left out'))).toHaveLength(7);
		expect(warnings.join('\n')).toMatch(/whole resource/);
		expect(warnings.join('\n')).toMatch(/TextQuoteSelector/);
		expect(warnings.join('\n')).toMatch(/percent/);
		expect(warnings.join('\n')).toMatch(/"1cm" is not a number of pixels/);
		expect(warnings.join('\n')).toMatch(/comments on an annotation that is not a mark of this page/);
		expect(warnings.join('\n')).toMatch(/Item 8 was left out/);
	});

	it('makes ids fit the schema and unique', () => {
		const shape = { source: imageId, selector: { type: 'SvgSelector', value: '<svg><circle cx="1" cy="1" r="1"/></svg>' } };
		const { layer: l } = importAnnotations(
			[
				{ id: 'http://x.example/a/same id!', type: 'Annotation', target: shape },
				{ id: 'http://y.example/b/same id!', type: 'Annotation', target: shape },
				{ type: 'Annotation', target: shape },
			],
			{ now: t0, authorId: bob },
		);
		expect(l.marks.map((m) => m.id)).toEqual(['same-id-', 'imported-1', 'imported-2']);
	});
});

describe('importAnnotations of malformed input', () => {
	it('gives a clear AnnotationImportError, never a TypeError', () => {
		const cases: [unknown, RegExp][] = [
			[null, /Expected a Web Annotation document/],
			[42, /Expected a Web Annotation document/],
			['{ not json', /not JSON/],
			[{ type: 'Manifest', items: [] }, /Expected an AnnotationPage or an Annotation, but its type is "Manifest"/],
			[{ type: 'AnnotationPage', items: 'nope' }, /items must be an array/],
			[{ foo: 1 }, /its type is missing/],
		];
		for (const [input, message] of cases) {
			const e = importError(input);
			expect(e).toBeInstanceOf(AnnotationImportError);
			expect(e).not.toBeInstanceOf(TypeError);
			expect((e as Error).message).toMatch(message);
		}
	});

	it('refuses marks that together are not a valid layer', () => {
		const page = exportAnnotations(layer, options);
		const second = structuredClone(page.items.find((a) => a.id.endsWith('/scale'))!);
		second.id = `${imageId}/annotations/scale-2`;
		second['meniscus:mark'] = { ...second['meniscus:mark'], id: 'scale-2' };
		const e = importError({ ...page, items: [...page.items, second] });
		expect(e).toBeInstanceOf(AnnotationImportError);
		expect((e as Error).message).toMatch(/A photo has one scale bar/);
	});

	it('treats broken Meniscus data in an annotation as a warning, not a crash', () => {
		const page = exportAnnotations(layer, options);
		const items = page.items.map((a, i) => (i === 0 ? { ...a, 'meniscus:mark': 'garbage' } : i === 1 ? { ...a, 'meniscus:mark': { ...a['meniscus:mark'], severity: 9 } } : a));
		const { layer: l, warnings } = importAnnotations({ ...page, items }, { now: t0 });
		expect(l.marks[0]).toMatchObject({ kind: 'outline', part: 'container', term: 'cracked', severity: 3 });
		expect(warnings.join('\n')).toMatch(/meniscus:mark data is not an object/);
		expect(warnings.join('\n')).toMatch(/Annotation .*\/thread was left out: severity: Severity is 1 \(minor\), 2 \(moderate\) or 3 \(severe\)/);
	});

	it('never throws anything but an AnnotationImportError, whatever it is given', () => {
		const annotationish = fc.record(
			{
				type: fc.constantFrom('Annotation', 'AnnotationPage', ['Annotation'], 'oa:Annotation'),
				id: fc.oneof(fc.string(), fc.anything()),
				items: fc.array(fc.anything(), { maxLength: 4 }),
				target: fc.oneof(fc.anything(), fc.record({ source: fc.anything(), selector: fc.record({ type: fc.constantFrom('SvgSelector', 'FragmentSelector'), value: fc.oneof(fc.string(), fc.constant('<svg><path d="M 1 2 L"/></svg>'), fc.constant('xywh=1,2,3')) }) })),
				body: fc.anything(),
				'meniscus:mark': fc.anything(),
				'meniscus:comment': fc.anything(),
			},
			{ requiredKeys: ['type'] },
		);
		fc.assert(
			fc.property(fc.oneof(fc.anything(), fc.jsonValue(), annotationish, fc.array(annotationish, { maxLength: 3 })), (input) => {
				const e = importError(input);
				if (e !== null) expect(e).toBeInstanceOf(AnnotationImportError);
			}),
			{ numRuns: 500 },
		);
	});
});
