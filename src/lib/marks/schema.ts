import { z } from 'zod';
import { PARTS } from '../check/vocabulary.ts';

/**
 * A photo's mark layer as data: every mark knows which part of the jar it is on, what the damage is
 * (a term from that part's vocabulary), how severe (1 minor, 2 moderate, 3 severe) and where, in the
 * photo's own pixels, so a later check can be compared with this one. Measurement marks (scale bar,
 * grey reference, levels, control points) carry geometry only. The layer is stored whole, as JSONB,
 * with a `schemaVersion`; older versions are brought forward by the pure migrations in migrate.ts.
 *
 * Coordinates are photo pixels of the upright image (after EXIF orientation), origin top left,
 * x to the right, y down: the same space as the IIIF tiles.
 */
export const MARK_SCHEMA_VERSION = 1;

/** Limits that keep a layer a record, not a payload: a clear 413/400 beyond them. */
export const MAX_MARKS_PER_LAYER = 2000;
export const MAX_VERTICES_PER_MARK = 5000;
export const MAX_COMMENTS_PER_LAYER = 2000;
export const MAX_LAYER_BYTES = 4 * 1024 * 1024;
/** The largest photo side Meniscus accepts is below this (200 MP); coordinates beyond it are nonsense. */
export const MAX_COORDINATE = 1_000_000;

const coord = z.number({ message: 'A coordinate must be a number.' }).finite('A coordinate must be a finite number.').min(-MAX_COORDINATE).max(MAX_COORDINATE);
export const PointSchema = z.tuple([coord, coord], { message: 'A point is a pair [x, y].' });
export type Point = z.infer<typeof PointSchema>;

const id = z.string().regex(/^[A-Za-z0-9_-]{1,40}$/, 'A mark id is 1–40 letters, digits, _ or -.');
const iso = z.iso.datetime({ message: 'A time must be an ISO 8601 date-time.' });
const uuid = z.uuid({ message: 'An author must be a user id.' });

export const SEVERITIES = [1, 2, 3] as const;
export type Severity = (typeof SEVERITIES)[number];

/** What every damage mark says about the damage. The term is checked against the part's vocabulary by the server. */
const damage = {
	part: z.enum(PARTS, { message: `The part must be one of: ${PARTS.join(', ')}.` }),
	term: z.string().trim().min(1, 'Choose a damage term.').max(60),
	severity: z.union([z.literal(1), z.literal(2), z.literal(3)], { message: 'Severity is 1 (minor), 2 (moderate) or 3 (severe).' }),
	note: z.string().max(2000, 'A note is at most 2,000 characters.').default(''),
};
const common = { id, authorId: uuid, createdAt: iso, updatedAt: iso };
const points = (min: number, what: string) =>
	z.array(PointSchema).min(min, `${what} needs at least ${min} points.`).max(MAX_VERTICES_PER_MARK, `A mark has at most ${MAX_VERTICES_PER_MARK.toLocaleString('en-GB')} points.`);

export const OutlineMarkSchema = z.object({ ...common, ...damage, kind: z.literal('outline'), points: points(3, 'An outline') }).strict();
export const PathMarkSchema = z.object({ ...common, ...damage, kind: z.literal('path'), points: points(2, 'A line') }).strict();
export const PinMarkSchema = z.object({ ...common, ...damage, kind: z.literal('pin'), at: PointSchema }).strict();
export const BoxMarkSchema = z
	.object({ ...common, ...damage, kind: z.literal('box'), x: coord, y: coord, w: z.number().positive('A box needs a width.').max(MAX_COORDINATE), h: z.number().positive('A box needs a height.').max(MAX_COORDINATE) })
	.strict();

/** A line drawn over the ruler in the photo and its known length: millimetres per pixel for this photo. */
export const ScaleMarkSchema = z
	.object({ ...common, kind: z.literal('scale'), from: PointSchema, to: PointSchema, lengthMm: z.number().positive('The scale bar needs its length in mm.').max(10_000) })
	.strict();
/** A box on the grey card, for white balance when photographs are compared. */
export const GreyMarkSchema = z.object({ ...common, kind: z.literal('grey'), x: coord, y: coord, w: z.number().positive().max(MAX_COORDINATE), h: z.number().positive().max(MAX_COORDINATE) }).strict();
export const LEVELS = ['fluid-line', 'specimen-top', 'inner-base'] as const;
export type Level = (typeof LEVELS)[number];
/** The fluid line, the specimen's top or the jar's inner base, drawn as a line across the jar. */
export const LevelMarkSchema = z.object({ ...common, kind: z.literal('level'), level: z.enum(LEVELS), from: PointSchema, to: PointSchema }).strict();
/** A numbered pin for registering this photo with another of the same jar. */
export const ControlMarkSchema = z.object({ ...common, kind: z.literal('control'), n: z.number().int().min(1).max(999), at: PointSchema }).strict();

export const MarkSchema = z.discriminatedUnion('kind', [OutlineMarkSchema, PathMarkSchema, PinMarkSchema, BoxMarkSchema, ScaleMarkSchema, GreyMarkSchema, LevelMarkSchema, ControlMarkSchema]);
export type Mark = z.infer<typeof MarkSchema>;
export type MarkKind = Mark['kind'];
export type DamageMark = Extract<Mark, { part: unknown }>;
export const DAMAGE_KINDS = ['outline', 'path', 'pin', 'box'] as const satisfies readonly MarkKind[];
export const MEASURE_KINDS = ['scale', 'grey', 'level', 'control'] as const satisfies readonly MarkKind[];
export const isDamage = (m: Mark): m is DamageMark => (DAMAGE_KINDS as readonly string[]).includes(m.kind);

/** A reviewer's comment pinned to a mark (reviewers comment; they do not edit marks). */
export const CommentSchema = z.object({ id, markId: id, authorId: uuid, text: z.string().trim().min(1, 'A comment cannot be empty.').max(2000), createdAt: iso }).strict();
export type MarkComment = z.infer<typeof CommentSchema>;

export const MarkLayerSchema = z
	.object({
		schemaVersion: z.literal(MARK_SCHEMA_VERSION),
		marks: z.array(MarkSchema).max(MAX_MARKS_PER_LAYER, `A layer holds at most ${MAX_MARKS_PER_LAYER.toLocaleString('en-GB')} marks.`),
		comments: z.array(CommentSchema).max(MAX_COMMENTS_PER_LAYER).default([]),
	})
	.strict()
	.superRefine((layer, ctx) => {
		const seen = new Set<string>();
		layer.marks.forEach((m, i) => {
			if (seen.has(m.id)) ctx.addIssue({ code: 'custom', path: ['marks', i, 'id'], message: `Two marks share the id ${m.id}.` });
			seen.add(m.id);
		});
		layer.comments.forEach((c, i) => {
			if (!seen.has(c.markId)) ctx.addIssue({ code: 'custom', path: ['comments', i, 'markId'], message: 'A comment must be pinned to a mark of this layer.' });
		});
		if (layer.marks.filter((m) => m.kind === 'scale').length > 1) ctx.addIssue({ code: 'custom', path: ['marks'], message: 'A photo has one scale bar.' });
		const numbers = new Set<number>();
		layer.marks.forEach((m, i) => {
			// Registration pairs control points by number: two with one number would pair wrongly.
			if (m.kind === 'control') {
				if (numbers.has(m.n)) ctx.addIssue({ code: 'custom', path: ['marks', i, 'n'], message: `Two control points are numbered ${m.n}.` });
				numbers.add(m.n);
			}
			if (m.kind === 'scale' && m.from[0] === m.to[0] && m.from[1] === m.to[1]) ctx.addIssue({ code: 'custom', path: ['marks', i], message: 'The scale bar needs two different ends.' });
		});
	});
export type MarkLayer = z.infer<typeof MarkLayerSchema>;

export const emptyLayer = (): MarkLayer => ({ schemaVersion: MARK_SCHEMA_VERSION, marks: [], comments: [] });
