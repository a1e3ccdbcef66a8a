import type { JarPhotoTruth } from './photos/drawJar.ts';
import { MarkLayerSchema, type Mark, type MarkLayer, type Point, type Severity } from '../../src/lib/marks/schema.ts';
import type { Grade, Part } from '../../src/lib/check/vocabulary.ts';

/**
 * The demo's marks on a drawn front view, placed from where the drawing says things are (the
 * truth the renderer returns): the scale bar over the ruler, a grey reference on the card, the
 * fluid line, the specimen's top and the inner base, and one damage mark per part the check found
 * damaged, at the place that part shows in the picture. Invented for the demo; positions are
 * plausible, not observed.
 */
type PartRecord = { grade: Grade | null; terms: string[]; note: string };

const SEVERITY: Record<Grade, Severity> = { good: 1, fair: 1, poor: 2, unacceptable: 3 };

/** `progress`: this check's place in the jar's series, 0 for the first and 1 for the latest. */
export function demoLayer(t: JarPhotoTruth, parts: Record<Part, PartRecord>, authorId: string, at: string, progress = 1): MarkLayer {
	const { centreX: cx, halfWidth: rx, rimY, fluidLineY, innerBaseY, specimenTopY } = t;
	const across = (y: number): [Point, Point] => [[cx - 0.88 * rx, y], [cx + 0.88 * rx, y]];
	const stamp = { authorId, createdAt: at, updatedAt: at };
	const inset = 0.15;
	const marks: Mark[] = [
		{ id: 'scale', kind: 'scale', from: t.scaleBar.from, to: t.scaleBar.to, lengthMm: t.scaleBar.lengthMm, ...stamp },
		{ id: 'grey', kind: 'grey', x: t.greyCard.x + inset * t.greyCard.w, y: t.greyCard.y + inset * t.greyCard.h, w: (1 - 2 * inset) * t.greyCard.w, h: (1 - 2 * inset) * t.greyCard.h, ...stamp },
		{ id: 'inner-base', kind: 'level', level: 'inner-base', ...pair(across(innerBaseY)), ...stamp },
		{ id: 'specimen-top', kind: 'level', level: 'specimen-top', ...pair(across(specimenTopY)), ...stamp },
	];
	if (fluidLineY < innerBaseY - 1) marks.push({ id: 'fluid-line', kind: 'level', level: 'fluid-line', ...pair(across(fluidLineY)), ...stamp });
	const span = innerBaseY - rimY;
	type Geometry = { kind: 'path' | 'outline'; points: Point[] } | { kind: 'pin'; at: Point } | { kind: 'box'; x: number; y: number; w: number; h: number };
	const place: Partial<Record<Part, (term: string) => Geometry>> = {
		// A crack runs further with the years: from under half of the rim at the first check to most of it at the last.
		seal: () => {
			const k = (0.4 + 0.6 * progress) * rx;
			return { kind: 'path', points: [[cx - 0.7 * k, rimY + 2], [cx - 0.25 * k, rimY + 5], [cx + 0.2 * k, rimY + 3], [cx + 0.55 * k, rimY + 6]] };
		},
		lid: () => ({ kind: 'pin', at: [cx + 0.45 * rx, rimY - 12] }),
		container: () => ({ kind: 'path', points: [[cx + 0.8 * rx, rimY + 0.25 * span], [cx + 0.74 * rx, rimY + 0.33 * span], [cx + 0.78 * rx, rimY + 0.42 * span]] }),
		// A low level is pinned in the headspace under the rim (the level lines measure it); other fluid findings get a box in the fluid.
		fluid: (term) => (term.includes('level') ? { kind: 'pin', at: [cx + 0.3 * rx, rimY + 0.05 * span] } : { kind: 'box', x: cx - 0.6 * rx, y: Math.min(fluidLineY, innerBaseY - 20) + 8, w: 0.5 * rx, h: Math.max(12, 0.12 * span) }),
		specimen: () => {
			const y = specimenTopY + 0.12 * span;
			return { kind: 'outline', points: [[cx - 0.18 * rx, y], [cx + 0.05 * rx, y - 0.04 * span], [cx + 0.2 * rx, y + 0.05 * span], [cx - 0.1 * rx, y + 0.1 * span]] };
		},
		mount: () => ({ kind: 'pin', at: [cx, rimY + 0.04 * span] }),
		label: () => ({ kind: 'box', x: cx - 0.5 * rx, y: innerBaseY - 0.16 * span, w: rx, h: 0.1 * span }),
	};
	for (const [part, record] of Object.entries(parts) as [Part, PartRecord][]) {
		const term = record.terms[0];
		if (!term || !record.grade || record.grade === 'good') continue;
		const geometry = place[part]?.(term);
		if (!geometry) continue;
		marks.push({ id: `${part}-1`, part, term, severity: SEVERITY[record.grade], note: record.note.slice(0, 2000), ...geometry, ...stamp } as Mark);
	}
	// The seeder's layers go through the same schema as anyone's.
	return MarkLayerSchema.parse({ schemaVersion: 1, marks: marks.map(clampTo(t.width, t.height)), comments: [] });
}

const pair = ([from, to]: [Point, Point]) => ({ from, to });

function clampTo(w: number, h: number) {
	const c = ([x, y]: Point): Point => [Math.round(Math.min(w, Math.max(0, x)) * 10) / 10, Math.round(Math.min(h, Math.max(0, y)) * 10) / 10];
	return (m: Mark): Mark => {
		switch (m.kind) {
			case 'outline':
			case 'path':
				return { ...m, points: m.points.map(c) };
			case 'pin':
			case 'control':
				return { ...m, at: c(m.at) };
			case 'scale':
			case 'level':
				return { ...m, from: c(m.from), to: c(m.to) };
			default:
				return m;
		}
	};
}
