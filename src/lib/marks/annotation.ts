/**
 * A mark layer as W3C Web Annotations, and back.
 *
 * Export follows the Web Annotation Data Model (W3C Recommendation, 23 February 2017,
 * https://www.w3.org/TR/annotation-model/): one AnnotationPage (§5.2) whose `items` are one
 * Annotation per mark, then one per comment. Each mark's target is a SpecificResource (§4) on the
 * photo's IIIF image service with an SvgSelector (§4.2.8) in photo pixels, so any Web Annotation or
 * IIIF viewer can draw it.
 *
 * Motivations (§3.3.5):
 * - damage marks: `tagging`. The mark's point is its damage term, a word from a controlled
 *   vocabulary, which is what a tag is. The other bodies say what they are by `purpose`: the term
 *   `tagging`, the part `classifying`, the severity `assessing`, the free note `describing`.
 * - measurement marks: `describing`. A scale bar, grey card, level line or control point says
 *   what is at a place in the photo ("Scale bar, 100 mm") and tags no damage. A motivation of our
 *   own would need a skos:broader link, and most viewers would ignore it; `describing` is shown
 *   by all of them.
 * - comments: `commenting`, targeting the annotation of the mark they are pinned to.
 *
 * What the model has no words for (the mark's kind and id, part and severity as codes, author and
 * times as Meniscus stores them, level name, scale length, control number) goes under
 * `meniscus:mark` / `meniscus:comment`, JSON literals in a namespace of our own, so export then
 * import gives back the same layer. Geometry, term and note live in one place only, the selector
 * and the bodies, so an edit made in another tool is not silently overridden by stale copies.
 *
 * Import reads these pages back, and also foreign annotations: a shape from an SvgSelector
 * (polygon, polyline, line, rect, circle, ellipse, path), a FragmentSelector or `#xywh=` target
 * (Media Fragments URI 1.0, https://www.w3.org/TR/media-frags/), with defaults, and a warning, for
 * what Meniscus needs and they do not say.
 */
import { z } from 'zod';
import { CHECK_LABELS, PARTS, type Part } from '../check/vocabulary.ts';
import { validOutline } from './geometry.ts';
import { LEVEL_LABEL } from './palette.ts';
import { CommentSchema, DAMAGE_KINDS, MARK_SCHEMA_VERSION, MEASURE_KINDS, MarkLayerSchema, MarkSchema, type Mark, type MarkComment, type MarkKind, type MarkLayer, type Point, type Severity } from './schema.ts';

export const ANNO_CONTEXT = 'http://www.w3.org/ns/anno.jsonld';
/**
 * Our namespace. An identifier, not a document to fetch: `.invalid` (RFC 6761) can never
 * resolve, so nothing ever depends on it resolving. Replace it when Meniscus has a stable domain;
 * import also accepts keys written in full with this IRI.
 */
export const MENISCUS_NS = 'https://meniscus.invalid/ns/marks#';

/**
 * The extra context object. `@json` (JSON-LD 1.1) keeps our objects as literals when the document
 * is processed as linked data, instead of their keys being dropped as undefined terms.
 */
const MENISCUS_CONTEXT = {
	'@version': 1.1,
	meniscus: MENISCUS_NS,
	'meniscus:mark': { '@type': '@json' },
	'meniscus:comment': { '@type': '@json' },
	'meniscus:layer': { '@type': '@json' },
} as const;

const SEVERITY_WORD: Record<Severity, string> = { 1: 'minor', 2: 'moderate', 3: 'severe' };

/** What a foreign annotation becomes when it does not say: stated in a warning so someone reviews it. */
export const IMPORT_DEFAULTS = { part: 'container' as Part, term: 'unclassified', severity: 1 as Severity };
/** The author of foreign marks when neither they nor the caller name one: the nil UUID (RFC 9562). */
const NIL_UUID = '00000000-0000-0000-0000-000000000000';

export interface TextualBody {
	type: 'TextualBody';
	value: string;
	format: 'text/plain';
	purpose: 'tagging' | 'classifying' | 'assessing' | 'describing' | 'commenting';
	language?: string;
}

export interface SvgTarget {
	type: 'SpecificResource';
	source: string;
	selector: { type: 'SvgSelector'; value: string };
}

export interface Agent {
	id: string;
	type: 'Person';
	name?: string;
}

export interface WebAnnotation {
	id: string;
	type: 'Annotation';
	motivation: 'tagging' | 'describing' | 'commenting';
	created: string;
	modified?: string;
	creator: Agent;
	body: TextualBody[];
	target: SvgTarget | string;
	'meniscus:mark'?: Record<string, unknown>;
	'meniscus:comment'?: Record<string, unknown>;
}

export interface AnnotationPage {
	'@context': [typeof ANNO_CONTEXT, typeof MENISCUS_CONTEXT];
	id: string;
	type: 'AnnotationPage';
	generator: { type: 'Software'; name: 'Meniscus' };
	'meniscus:layer': { schemaVersion: number };
	items: WebAnnotation[];
}

export interface ExportOptions {
	/** The photo's IIIF image service id, the `source` of every target. */
	imageId: string;
	/** The photo's size in pixels, the SVG's size. */
	width: number;
	height: number;
	/** A person's display name, if it may be shared. */
	creatorName?: (authorId: string) => string | undefined;
	/** Where annotation ids start; by default `${imageId}/annotations`. */
	idBase?: string;
}

// ————————————————————————————————————————— export

/** JavaScript's shortest round-trip form: the number read back from the SVG is the same double. */
const num = (n: number): string => String(n);
const pts = (points: readonly Point[]): string => points.map(([x, y]) => `${num(x)},${num(y)}`).join(' ');

function shapeOf(mark: Mark, pinRadius: number): string {
	switch (mark.kind) {
		case 'outline':
			return `<polygon points="${pts(mark.points)}"/>`;
		case 'path':
			return `<polyline points="${pts(mark.points)}" fill="none"/>`;
		case 'pin':
		case 'control':
			return `<circle cx="${num(mark.at[0])}" cy="${num(mark.at[1])}" r="${num(pinRadius)}"/>`;
		case 'box':
		case 'grey':
			return `<rect x="${num(mark.x)}" y="${num(mark.y)}" width="${num(mark.w)}" height="${num(mark.h)}"/>`;
		case 'scale':
		case 'level':
			return `<line x1="${num(mark.from[0])}" y1="${num(mark.from[1])}" x2="${num(mark.to[0])}" y2="${num(mark.to[1])}"/>`;
	}
}

const text = (value: string, purpose: TextualBody['purpose'], language?: string): TextualBody =>
	language ? { type: 'TextualBody', value, format: 'text/plain', purpose, language } : { type: 'TextualBody', value, format: 'text/plain', purpose };

/** The bodies and our own fields of one mark; geometry, term and note are not repeated in the latter. */
function describeMark(mark: Mark): { motivation: WebAnnotation['motivation']; body: TextualBody[]; meta: Record<string, unknown> } {
	const meta: Record<string, unknown> = { kind: mark.kind, id: mark.id, authorId: mark.authorId, createdAt: mark.createdAt, updatedAt: mark.updatedAt };
	switch (mark.kind) {
		case 'outline':
		case 'path':
		case 'pin':
		case 'box': {
			meta.part = mark.part;
			meta.severity = mark.severity;
			const body = [
				text(mark.term, 'tagging', 'en'),
				text(CHECK_LABELS.part[mark.part], 'classifying', 'en'),
				text(`Severity ${mark.severity} of 3 (${SEVERITY_WORD[mark.severity]})`, 'assessing', 'en'),
			];
			// The note is the user's own words, language unknown.
			if (mark.note !== '') body.push(text(mark.note, 'describing'));
			return { motivation: 'tagging', body, meta };
		}
		case 'scale':
			meta.lengthMm = mark.lengthMm;
			return { motivation: 'describing', body: [text(`Scale bar, ${mark.lengthMm} mm`, 'describing', 'en')], meta };
		case 'grey':
			return { motivation: 'describing', body: [text('Grey reference', 'describing', 'en')], meta };
		case 'level':
			meta.level = mark.level;
			return { motivation: 'describing', body: [text(LEVEL_LABEL[mark.level], 'describing', 'en')], meta };
		case 'control':
			meta.n = mark.n;
			return { motivation: 'describing', body: [text(`Control point ${mark.n}`, 'describing', 'en')], meta };
	}
}

/**
 * The layer as one AnnotationPage of JSON-LD. Authors are `urn:uuid:` IRIs (RFC 4122 §3), named only
 * through `creatorName`, so an export shares no name the caller did not choose to share.
 */
export function exportAnnotations(layer: MarkLayer, options: ExportOptions): AnnotationPage {
	const { imageId, width, height } = options;
	if (typeof imageId !== 'string' || imageId.trim() === '') throw new RangeError('Exporting marks needs the photo’s image id.');
	for (const [name, v] of [['width', width], ['height', height]] as const) {
		if (!Number.isFinite(v) || v <= 0) throw new RangeError(`Exporting marks needs the photo’s ${name} in pixels.`);
	}
	const base = (options.idBase ?? `${imageId}/annotations`).replace(/\/+$/, '');
	const markIri = (id: string) => `${base}/${id}`;
	const creator = (authorId: string): Agent => {
		const name = options.creatorName?.(authorId);
		return name ? { id: `urn:uuid:${authorId}`, type: 'Person', name } : { id: `urn:uuid:${authorId}`, type: 'Person' };
	};
	// Big enough to see in a viewer that draws the circle as given; the centre is what matters.
	const pinRadius = Math.max(4, Math.round(Math.max(width, height) / 250));
	const svg = (shape: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="${num(width)}" height="${num(height)}">${shape}</svg>`;

	const marks = layer.marks.map((mark): WebAnnotation => {
		const { motivation, body, meta } = describeMark(mark);
		return {
			id: markIri(mark.id),
			type: 'Annotation',
			motivation,
			created: mark.createdAt,
			modified: mark.updatedAt,
			creator: creator(mark.authorId),
			body,
			target: { type: 'SpecificResource', source: imageId, selector: { type: 'SvgSelector', value: svg(shapeOf(mark, pinRadius)) } },
			'meniscus:mark': meta,
		};
	});
	const comments = layer.comments.map(
		(c): WebAnnotation => ({
			id: `${base}/comments/${c.id}`,
			type: 'Annotation',
			motivation: 'commenting',
			created: c.createdAt,
			creator: creator(c.authorId),
			body: [text(c.text, 'commenting')],
			target: markIri(c.markId),
			'meniscus:comment': { id: c.id, markId: c.markId, authorId: c.authorId, createdAt: c.createdAt },
		}),
	);
	return {
		'@context': [ANNO_CONTEXT, MENISCUS_CONTEXT],
		id: base,
		type: 'AnnotationPage',
		generator: { type: 'Software', name: 'Meniscus' },
		'meniscus:layer': { schemaVersion: layer.schemaVersion },
		items: [...marks, ...comments],
	};
}

// ————————————————————————————————————————— import

/** Why a document could not be imported at all (single annotations that cannot be read are warnings). */
export class AnnotationImportError extends Error {
	override readonly name = 'AnnotationImportError';
}

export interface ImportOptions {
	/** Author of foreign annotations that name no `urn:uuid:` creator: usually the person importing. */
	authorId?: string;
	/** Time for foreign annotations without one; the current time if not given. */
	now?: string;
}

export interface ImportResult {
	layer: MarkLayer;
	/** One sentence per thing that was guessed, defaulted or left out. */
	warnings: string[];
}

const oneOrMany = <T extends z.ZodType>(s: T) => z.union([s, z.array(s)]);
const typeIs = (name: string) =>
	oneOrMany(z.string()).refine((t) => (Array.isArray(t) ? t : [t]).some((v) => v === name || v === `oa:${name}` || v.endsWith(`#${name}`)), { message: `The type must be ${name}.` });

const AnnotationIn = z
	.object({
		id: z.string().optional(),
		type: typeIs('Annotation'),
		motivation: oneOrMany(z.string()).optional(),
		body: z.unknown().optional(),
		bodyValue: z.string().optional(),
		target: z.unknown(),
		creator: z.unknown().optional(),
		created: z.string().optional(),
		modified: z.string().optional(),
	})
	.loose();
type AnnotationIn = z.infer<typeof AnnotationIn>;

const PageIn = z.object({ type: typeIs('AnnotationPage'), items: z.array(z.unknown()) }).loose();
const CollectionIn = z.object({ type: typeIs('AnnotationCollection'), first: PageIn }).loose();
const LayerInfoIn = z.object({ schemaVersion: z.number() }).loose();

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const asArray = (v: unknown): unknown[] => (v === undefined || v === null ? [] : Array.isArray(v) ? v : [v]);

/** Our key as written by us, or in full with the namespace IRI by a processor that expanded it. */
const ours = (o: Record<string, unknown>, key: string): unknown => o[`meniscus:${key}`] ?? o[`${MENISCUS_NS}${key}`];

/** The first schema finding as a sentence, with where it is. */
function firstIssue(error: z.ZodError): string {
	const i = error.issues[0];
	if (!i) return 'It is not valid.';
	const s = i.path.length > 0 ? `${i.path.map(String).join('.')}: ${i.message}` : i.message;
	return /[.!?]$/.test(s) ? s : `${s}.`;
}

/** The annotations in a page, a collection with its first page embedded, a bare array, or one annotation. */
function itemsOf(doc: unknown, warnings: string[]): unknown[] {
	if (Array.isArray(doc)) return doc;
	if (!isRecord(doc)) throw new AnnotationImportError('Expected a Web Annotation document: a JSON object (an AnnotationPage or an Annotation) or an array of annotations.');
	const page = PageIn.safeParse(doc);
	if (page.success) {
		const info = ours(doc, 'layer');
		if (info !== undefined) {
			const v = LayerInfoIn.safeParse(info);
			if (!v.success) throw new AnnotationImportError('The page’s meniscus:layer is not valid: it needs a schemaVersion.');
			if (v.data.schemaVersion > MARK_SCHEMA_VERSION) {
				throw new AnnotationImportError(`These annotations were written by a newer Meniscus (version ${v.data.schemaVersion}); this server reads up to version ${MARK_SCHEMA_VERSION}.`);
			}
			if (v.data.schemaVersion < MARK_SCHEMA_VERSION) throw new AnnotationImportError(`These annotations are from Meniscus layer version ${v.data.schemaVersion}, which cannot be imported yet.`);
		}
		return page.data.items;
	}
	const collection = CollectionIn.safeParse(doc);
	if (collection.success) {
		if (collection.data.first.next !== undefined) warnings.push('Only the first page of the annotation collection was imported; fetch and import the others separately.');
		return collection.data.first.items;
	}
	if (AnnotationIn.safeParse(doc).success) return [doc];
	if ('items' in doc && !Array.isArray(doc.items)) throw new AnnotationImportError('An AnnotationPage’s items must be an array.');
	throw new AnnotationImportError(`Expected an AnnotationPage or an Annotation, but its type is ${JSON.stringify(doc.type) ?? 'missing'}.`);
}

// ——— shapes

type Shape =
	| { type: 'polygon'; points: Point[] }
	| { type: 'polyline'; points: Point[] }
	| { type: 'circle'; at: Point }
	| { type: 'rect'; x: number; y: number; w: number; h: number };

/** A failure to read one annotation: reported as a warning, the annotation skipped. */
class Skip extends Error {}

function attributes(tag: string): Map<string, string> {
	const out = new Map<string, string>();
	for (const m of tag.matchAll(/([A-Za-z_:][-A-Za-z0-9_:.]*)\s*=\s*(?:"([^"]*)"|'([^']*)')/g)) out.set(m[1]!.toLowerCase(), m[2] ?? m[3] ?? '');
	return out;
}

/** An SVG length in user units: a number, optionally "px"; percentages and other units cannot be mapped to pixels. */
function length(attrs: Map<string, string>, name: string, fallback?: number): number {
	const raw = attrs.get(name);
	if (raw === undefined) {
		if (fallback !== undefined) return fallback;
		throw new Skip(`its SVG shape has no ${name}`);
	}
	const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(px)?\s*$/.exec(raw);
	if (!m) throw new Skip(`its SVG ${name} "${raw}" is not a number of pixels`);
	return Number(m[1]);
}

function pointList(raw: string | undefined): Point[] {
	const nums = (raw ?? '').trim().split(/[\s,]+/).filter((s) => s !== '').map(Number);
	if (nums.length % 2 !== 0 || nums.some((n) => !Number.isFinite(n))) throw new Skip('its SVG points are not pairs of numbers');
	const out: Point[] = [];
	for (let i = 0; i < nums.length; i += 2) out.push([nums[i]!, nums[i + 1]!]);
	return out;
}

/** Parameters per SVG path command; only the end point of each is kept. */
const PATH_ARGS: Record<string, number> = { m: 2, l: 2, h: 1, v: 1, c: 6, s: 4, q: 4, t: 2, a: 7, z: 0 };

/**
 * The vertices of an SVG path's first subpath: straight segments exactly, curves and arcs by their
 * end points (with a warning), relative commands resolved. A closing Z makes it a polygon.
 */
function pathShape(d: string, warn: (s: string) => void): Shape {
	const tokens = d.match(/[MmLlHhVvCcSsQqTtAaZz]|[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?/g) ?? [];
	const points: Point[] = [];
	let cur: Point = [0, 0];
	let cmd = '';
	let closed = false;
	let curved = false;
	let i = 0;
	while (i < tokens.length) {
		const t = tokens[i]!;
		if (/^[A-Za-z]$/.test(t)) {
			cmd = t;
			i++;
			if (cmd.toLowerCase() === 'z') {
				closed = true;
				// Further subpaths (holes, islands) are not one mark.
				if (i < tokens.length) warn('its SVG path has more than one part; only the first was imported');
				break;
			}
			if (cmd.toLowerCase() === 'm' && points.length > 0) {
				warn('its SVG path has more than one part; only the first was imported');
				break;
			}
			continue;
		}
		if (cmd === '') throw new Skip('its SVG path does not start with a command');
		const lower = cmd.toLowerCase();
		const n = PATH_ARGS[lower]!;
		const args = tokens.slice(i, i + n).map(Number);
		if (args.length < n) throw new Skip('its SVG path ends in the middle of a command');
		i += n;
		const rel = cmd === lower;
		let next: Point;
		if (lower === 'h') next = [rel ? cur[0] + args[0]! : args[0]!, cur[1]];
		else if (lower === 'v') next = [cur[0], rel ? cur[1] + args[0]! : args[0]!];
		else {
			const x = args[n - 2]!;
			const y = args[n - 1]!;
			next = rel ? [cur[0] + x, cur[1] + y] : [x, y];
		}
		if ('csqta'.includes(lower)) curved = true;
		points.push(next);
		cur = next;
		// Coordinates after a moveto are implicit linetos (SVG 1.1, §8.3.2).
		if (lower === 'm') cmd = rel ? 'l' : 'L';
	}
	if (curved) warn('its curves were imported as straight lines between their end points');
	if (closed && points.length > 1) {
		const [f, l] = [points[0]!, points[points.length - 1]!];
		if (f[0] === l[0] && f[1] === l[1]) points.pop();
	}
	return closed ? { type: 'polygon', points } : { type: 'polyline', points };
}

/** The first shape in an SVG selector's value (a string; no DOM, so this runs on the server too). */
function svgShape(svg: string, warn: (s: string) => void): Shape {
	// Elements may carry a namespace prefix (<svg:polygon>), as in the Data Model's own example.
	const tags = [...svg.matchAll(/<\s*(?:[A-Za-z_][\w.-]*:)?(polygon|polyline|line|rect|circle|ellipse|path)\b([^>]*)>/gi)];
	const first = tags[0];
	if (!first) throw new Skip('its SVG selector holds no polygon, polyline, line, rect, circle, ellipse or path');
	if (tags.length > 1) warn(`its SVG selector holds ${tags.length} shapes; only the first was imported`);
	const name = first[1]!.toLowerCase();
	const attrs = attributes(first[2]!);
	if (attrs.has('transform') || /<\s*g\b[^>]*\btransform\s*=/i.test(svg)) warn('its SVG transform was not applied; check the position');
	switch (name) {
		case 'polygon':
			return { type: 'polygon', points: pointList(attrs.get('points')) };
		case 'polyline':
			return { type: 'polyline', points: pointList(attrs.get('points')) };
		case 'line':
			return { type: 'polyline', points: [[length(attrs, 'x1', 0), length(attrs, 'y1', 0)], [length(attrs, 'x2', 0), length(attrs, 'y2', 0)]] };
		case 'rect':
			return { type: 'rect', x: length(attrs, 'x', 0), y: length(attrs, 'y', 0), w: length(attrs, 'width'), h: length(attrs, 'height') };
		case 'circle':
		case 'ellipse':
			return { type: 'circle', at: [length(attrs, 'cx', 0), length(attrs, 'cy', 0)] };
		default:
			return pathShape(attrs.get('d') ?? '', warn);
	}
}

/** Media Fragments spatial dimension, `xywh=[pixel:]x,y,w,h` (Media Fragments URI 1.0, §4.2.2). */
function xywh(fragment: string): Shape {
	const m = /(?:^|[#&])xywh=(pixel:|percent:)?([^&]*)/.exec(fragment);
	if (!m) throw new Skip('its fragment selector is not an xywh= region');
	if (m[1] === 'percent:') throw new Skip('its region is in percent, which needs the image size to place');
	const v = m[2]!.split(',').map(Number);
	if (v.length !== 4 || v.some((n) => !Number.isFinite(n))) throw new Skip(`its region "${m[2]}" is not four numbers`);
	return { type: 'rect', x: v[0]!, y: v[1]!, w: v[2]!, h: v[3]! };
}

/** The shape an annotation's target selects, from its first target and first usable selector. */
function targetShape(target: unknown, warn: (s: string) => void): Shape {
	const targets = asArray(target);
	if (targets.length === 0) throw new Skip('it has no target');
	if (targets.length > 1) warn('it has several targets; only the first was imported');
	const t = targets[0];
	if (typeof t === 'string') {
		if (t.includes('#xywh=')) return xywh(t.slice(t.indexOf('#')));
		throw new Skip('its target is a whole resource, not a region of the photo');
	}
	if (!isRecord(t)) throw new Skip('its target is not a resource');
	const ref = typeof t.source === 'string' ? t.source : typeof t.id === 'string' ? t.id : '';
	if (t.selector === undefined && ref.includes('#xywh=')) return xywh(ref.slice(ref.indexOf('#')));
	const selectors = asArray(t.selector).filter(isRecord);
	// Several selectors are alternatives for the same region (§4.2): take the most precise we read.
	const svg = selectors.find((s) => s.type === 'SvgSelector' && typeof s.value === 'string');
	if (svg) return svgShape(svg.value as string, warn);
	const frag = selectors.find((s) => s.type === 'FragmentSelector' && typeof s.value === 'string');
	if (frag) return xywh(frag.value as string);
	throw new Skip(selectors.length > 0 ? `its selector (${String(selectors[0]!.type)}) is not one Meniscus reads` : 'its target has no selector');
}

const KIND_WORD: Record<MarkKind, string> = {
	outline: 'an outline',
	path: 'a line',
	pin: 'a pin',
	box: 'a box',
	scale: 'a scale bar',
	grey: 'a grey reference',
	level: 'a level line',
	control: 'a control point',
};

/** The geometry fields of a mark of `kind` from a shape, or why the two do not fit. */
function geometryFor(kind: MarkKind, shape: Shape): Record<string, unknown> {
	const misfit = () => new Skip(`its shape (${shape.type}) cannot be ${KIND_WORD[kind]}`);
	switch (kind) {
		case 'outline':
			if (shape.type === 'polygon') return { points: shape.points };
			if (shape.type === 'rect') return { points: [[shape.x, shape.y], [shape.x + shape.w, shape.y], [shape.x + shape.w, shape.y + shape.h], [shape.x, shape.y + shape.h]] };
			throw misfit();
		case 'path':
			if (shape.type === 'polyline') return { points: shape.points };
			throw misfit();
		case 'pin':
		case 'control':
			if (shape.type === 'circle') return { at: shape.at };
			throw misfit();
		case 'box':
		case 'grey':
			if (shape.type === 'rect') return { x: shape.x, y: shape.y, w: shape.w, h: shape.h };
			throw misfit();
		case 'scale':
		case 'level':
			if (shape.type === 'polyline' && shape.points.length === 2) return { from: shape.points[0], to: shape.points[1] };
			throw misfit();
	}
}

/** What a foreign shape becomes: every one of them is read as damage, since only Meniscus writes measurement marks. */
const NATURAL_KIND: Record<Shape['type'], MarkKind> = { polygon: 'outline', polyline: 'path', circle: 'pin', rect: 'box' };
const MARK_KINDS: readonly string[] = [...DAMAGE_KINDS, ...MEASURE_KINDS];

// ——— bodies

interface Bodies {
	tagging: string[];
	classifying: string[];
	assessing: string[];
	describing: string[];
	commenting: string[];
}

/** Textual bodies sorted by purpose; a body without one takes the annotation's motivation (§3.3.5). */
function bodiesOf(a: AnnotationIn): Bodies {
	const out: Bodies = { tagging: [], classifying: [], assessing: [], describing: [], commenting: [] };
	const motivations = asArray(a.motivation).filter((m): m is string => typeof m === 'string').map((m) => m.replace(/^oa:/, ''));
	const fallback = motivations[0] ?? 'describing';
	const add = (purpose: string, value: string) => {
		const key = (purpose in out ? purpose : fallback in out ? fallback : 'describing') as keyof Bodies;
		// Whitespace is kept: a note of spaces is still the note that was written.
		if (value !== '') out[key].push(value);
	};
	for (const b of asArray(a.body)) {
		if (typeof b === 'string') continue; // a linked resource: nothing to read here
		if (!isRecord(b) || typeof b.value !== 'string') continue;
		const purposes = asArray(b.purpose).filter((p): p is string => typeof p === 'string');
		add((purposes[0] ?? fallback).replace(/^oa:/, ''), b.value);
	}
	if (a.bodyValue !== undefined) add(fallback, a.bodyValue);
	return out;
}

function partFrom(values: string[]): Part | undefined {
	for (const v of values) {
		const s = v.trim().toLowerCase();
		const hit = PARTS.find((p) => p === s || CHECK_LABELS.part[p].toLowerCase() === s);
		if (hit) return hit;
	}
	return undefined;
}

function severityFrom(values: string[]): Severity | undefined {
	for (const v of values) {
		const digit = /\b([123])\b/.exec(v);
		if (digit) return Number(digit[1]) as Severity;
		const word = /\b(minor|moderate|severe)\b/i.exec(v);
		if (word) return ({ minor: 1, moderate: 2, severe: 3 } as const)[word[1]!.toLowerCase() as 'minor' | 'moderate' | 'severe'];
	}
	return undefined;
}

// ——— people, times, ids

const UuidIn = z.uuid();
const IsoIn = z.iso.datetime();

function authorFrom(creator: unknown): string | undefined {
	for (const c of asArray(creator)) {
		const id = typeof c === 'string' ? c : isRecord(c) && typeof c.id === 'string' ? c.id : undefined;
		const m = id === undefined ? null : /^urn:uuid:(.+)$/i.exec(id);
		if (m && UuidIn.safeParse(m[1]!.toLowerCase()).success) return m[1]!.toLowerCase();
	}
	return undefined;
}

/** An ISO 8601 time as the schema stores it (UTC, Z); offsets are converted, nonsense is dropped. */
function timeFrom(v: unknown): string | undefined {
	if (typeof v !== 'string') return undefined;
	if (IsoIn.safeParse(v).success) return v;
	const t = Date.parse(v);
	return Number.isNaN(t) ? undefined : new Date(t).toISOString();
}

/** A mark or comment id from the end of an annotation IRI, made to fit the schema and unique. */
function idFrom(iri: string | undefined, taken: Set<string>, prefix: string): string {
	const tail = (iri ?? '').split(/[/#:]/).filter((s) => s !== '').pop() ?? '';
	let id = tail.replace(/[^A-Za-z0-9_-]/g, '-').slice(0, 40);
	for (let k = 1; id === '' || taken.has(id); k++) id = `${prefix}-${k}`;
	taken.add(id);
	return id;
}

const label = (a: AnnotationIn, index: number): string => (a.id ? `Annotation ${a.id}` : `Annotation ${index + 1}`);

/**
 * A mark layer from Web Annotation JSON (an object, or its text). Pages exported by Meniscus come
 * back as they were. Foreign annotations become damage marks when they have a shape Meniscus can
 * read, with defaults, named in `warnings`, for part, term and severity; annotations that cannot be
 * read are left out, each with a warning. A document that is not Web Annotation JSON at all, or
 * that gives an invalid layer, is an AnnotationImportError, never a TypeError.
 */
export function importAnnotations(json: unknown, options: ImportOptions = {}): ImportResult {
	try {
		return importUnchecked(json, options);
	} catch (e) {
		if (e instanceof AnnotationImportError) throw e;
		// A shape of input not foreseen above: still an import error, with the cause kept for debugging.
		throw new AnnotationImportError(`These annotations could not be read: ${e instanceof Error ? e.message : String(e)}`, { cause: e });
	}
}

function importUnchecked(json: unknown, options: ImportOptions): ImportResult {
	let doc = json;
	if (typeof json === 'string') {
		try {
			doc = JSON.parse(json);
		} catch {
			throw new AnnotationImportError('The file is not JSON, so it cannot be Web Annotations.');
		}
	}
	const warnings: string[] = [];
	const items = itemsOf(doc, warnings);
	const now = timeFrom(options.now) ?? new Date().toISOString();
	if (options.authorId !== undefined && !UuidIn.safeParse(options.authorId).success) throw new AnnotationImportError('The importing author must be a user id.');

	const marks: Mark[] = [];
	const comments: { a: AnnotationIn; index: number }[] = [];
	const markIds = new Set<string>();
	const markByIri = new Map<string, string>();

	items.forEach((item, index) => {
		const parsed = AnnotationIn.safeParse(item);
		if (!parsed.success) {
			const id = isRecord(item) && typeof item.id === 'string' ? `Annotation ${item.id}` : `Item ${index + 1}`;
			warnings.push(`${id} was left out: ${firstIssue(parsed.error)}`);
			return;
		}
		const a = parsed.data;
		const motivations = asArray(a.motivation).map((m) => String(m).replace(/^oa:/, ''));
		const meta = ours(a, 'mark');
		const commentMeta = ours(a, 'comment');
		// A comment is about another annotation; one about a region of the photo is a mark with a note.
		const aboutAnnotation = typeof a.target === 'string' && !a.target.includes('#xywh=');
		if (commentMeta !== undefined || ((motivations.includes('commenting') || motivations.includes('replying')) && aboutAnnotation && meta === undefined)) {
			comments.push({ a, index });
			return;
		}
		const notes: string[] = [];
		const warn = (s: string) => notes.push(s);
		try {
			const mark = markFrom(a, isRecord(meta) ? meta : meta === undefined ? undefined : null, markIds, options, now, warn);
			marks.push(mark);
			markIds.add(mark.id);
			if (a.id) markByIri.set(a.id, mark.id);
			for (const n of notes) warnings.push(`${label(a, index)}: ${n}.`);
		} catch (e) {
			if (!(e instanceof Skip)) throw e;
			for (const n of notes) warnings.push(`${label(a, index)}: ${n}.`);
			warnings.push(`${label(a, index)} was left out: ${e.message}.`);
		}
	});

	const commentIds = new Set<string>();
	const layerComments: MarkComment[] = [];
	for (const { a, index } of comments) {
		const meta = ours(a, 'comment');
		const m = isRecord(meta) ? meta : {};
		const target = asArray(a.target)[0];
		const targetIri = typeof target === 'string' ? target : isRecord(target) && typeof target.source === 'string' ? target.source : isRecord(target) && typeof target.id === 'string' ? target.id : undefined;
		const markId = typeof m.markId === 'string' ? m.markId : targetIri === undefined ? undefined : markByIri.get(targetIri);
		if (markId === undefined || !markIds.has(markId)) {
			warnings.push(`${label(a, index)} was left out: it comments on an annotation that is not a mark of this page.`);
			continue;
		}
		const b = bodiesOf(a);
		const raw = {
			id: typeof m.id === 'string' ? m.id : idFrom(a.id, commentIds, 'comment'),
			markId,
			authorId: m.authorId ?? authorFrom(a.creator) ?? options.authorId ?? NIL_UUID,
			text: [...b.commenting, ...b.describing, ...b.tagging].join('\n\n').slice(0, 2000),
			createdAt: m.createdAt ?? timeFrom(a.created) ?? now,
		};
		const c = CommentSchema.safeParse(raw);
		if (!c.success) {
			warnings.push(`${label(a, index)} was left out: ${firstIssue(c.error)}`);
			continue;
		}
		commentIds.add(c.data.id);
		layerComments.push(c.data);
	}

	const layer = MarkLayerSchema.safeParse({ schemaVersion: MARK_SCHEMA_VERSION, marks, comments: layerComments });
	if (!layer.success) throw new AnnotationImportError(`The imported marks do not make a valid layer: ${firstIssue(layer.error)}`);
	return { layer: layer.data, warnings };
}

/**
 * One mark from one annotation. `meta` is our own data (undefined when absent, null when present
 * but not an object). Throws Skip when the annotation cannot be a mark.
 */
function markFrom(a: AnnotationIn, meta: Record<string, unknown> | null | undefined, taken: Set<string>, options: ImportOptions, now: string, warn: (s: string) => void): Mark {
	if (meta === null) warn('its meniscus:mark data is not an object and was ignored');
	const m = meta ?? {};
	const shape = targetShape(a.target, warn);
	const kindIn = typeof m.kind === 'string' && MARK_KINDS.includes(m.kind) ? (m.kind as MarkKind) : undefined;
	if (m.kind !== undefined && kindIn === undefined) warn(`its kind "${String(m.kind)}" is not a Meniscus mark kind; it was read from its shape`);
	const kind = kindIn ?? NATURAL_KIND[shape.type];
	const foreign = meta === undefined || meta === null;

	const iri = typeof m.id === 'string' ? m.id : a.id;
	const id = typeof m.id === 'string' && !taken.has(m.id) ? m.id : idFrom(iri, new Set(taken), 'imported');
	let authorId = typeof m.authorId === 'string' ? m.authorId : authorFrom(a.creator) ?? options.authorId;
	if (authorId === undefined) {
		warn('it names no Meniscus user as its author, so it has none');
		authorId = NIL_UUID;
	}
	const createdAt = (typeof m.createdAt === 'string' ? m.createdAt : undefined) ?? timeFrom(a.created) ?? now;
	const updatedAt = (typeof m.updatedAt === 'string' ? m.updatedAt : undefined) ?? timeFrom(a.modified) ?? createdAt;
	const raw: Record<string, unknown> = { id, authorId, createdAt, updatedAt, kind, ...geometryFor(kind, shape) };

	if (kind === 'outline' || kind === 'path' || kind === 'pin' || kind === 'box') {
		const b = bodiesOf(a);
		const part = (m.part as Part | undefined) ?? partFrom(b.classifying) ?? partFrom(b.tagging);
		const severity = (m.severity as Severity | undefined) ?? severityFrom(b.assessing);
		// Ours carry the term as the one tagging body; a foreign tool may also tag with the part's name.
		const term = (foreign ? b.tagging.find((t) => partFrom([t]) === undefined) : b.tagging[0])?.trim().slice(0, 60);
		const defaulted: [string, string][] = [];
		if (part === undefined) defaulted.push(['part', CHECK_LABELS.part[IMPORT_DEFAULTS.part]]);
		if (term === undefined) defaulted.push(['term', `"${IMPORT_DEFAULTS.term}"`]);
		if (severity === undefined) defaulted.push(['severity', `${IMPORT_DEFAULTS.severity} (${SEVERITY_WORD[IMPORT_DEFAULTS.severity]})`]);
		const describing = foreign ? [...b.describing, ...b.commenting] : b.describing;
		let note = describing.join('\n\n');
		if (note.length > 2000) {
			warn('its description was cut to 2,000 characters');
			note = note.slice(0, 2000);
		}
		Object.assign(raw, { part: part ?? IMPORT_DEFAULTS.part, term: term ?? IMPORT_DEFAULTS.term, severity: severity ?? IMPORT_DEFAULTS.severity, note });
		if (foreign || defaulted.length > 0) {
			const list = (xs: string[]) => (xs.length < 2 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`);
			const given = defaulted.length > 0 ? `; it did not give its ${list(defaulted.map((d) => d[0]))}, so it has ${list(defaulted.map((d) => `${d[0]} ${d[1]}`))} until someone reviews it` : '';
			warn(`imported as ${KIND_WORD[kind]}${given}`);
		}
		if (kind === 'outline') {
			const check = validOutline(raw.points as Point[]);
			if (!check.ok) warn(`${check.reason.charAt(0).toLowerCase()}${check.reason.slice(1).replace(/\.$/, '')}; it was kept for you to redraw`);
		}
	} else {
		if (kind === 'scale') raw.lengthMm = m.lengthMm;
		if (kind === 'level') raw.level = m.level;
		if (kind === 'control') raw.n = m.n;
	}
	const mark = MarkSchema.safeParse(raw);
	if (!mark.success) throw new Skip(firstIssue(mark.error).replace(/\.$/, ''));
	return mark.data;
}
