import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { DEFAULT_INTERVAL_MONTHS, nextCheckDue, suggestedPriority, worstGrade } from '../../src/lib/check/grading.ts';
import { CHECK_LABELS, GRADES, PARTS, type CheckState, type Grade, type Part } from '../../src/lib/check/vocabulary.ts';
import { realStrengthAt20 } from '../../src/lib/fluid/alcoholometry.ts';
import { mlPerMm, type JarShape } from '../../src/lib/fluid/jar.ts';
import { CHECK_PLANS, type CheckPlan } from './demoCheckPlan.ts';

/**
 * Past condition checks of the demo jars, so every role has history to look at on first start:
 * two to four checks each over the last few years, levels falling at a rate that suits the seal,
 * spirit strengths drifting down, formalin turning acidic, a few checks still open. Deterministic
 * (a seeded generator per jar) so the demo is the same every time. The rates and grade thresholds
 * are invented for the demo, not published figures.
 */
type Jar = {
	id: string;
	object_number: string;
	preservative_kind: string;
	preservative_recorded: string;
	container_shape: JarShape;
	w: number;
	d: number | null;
	h: number;
	seal_type: string;
	closure_type: string;
	hazards: { flag: string }[];
	next_check_due: string | null;
	location: string | null;
};
type PartRecord = { grade: Grade | null; terms: string[]; note: string };
type Row = Record<string, unknown>;

const DAY = 86_400_000;
const iso = (t: number) => new Date(t).toISOString().slice(0, 10);
const at = (date: string, hour: number) => new Date(`${date}T${String(hour).padStart(2, '0')}:00:00Z`);
const addDays = (date: string, n: number) => iso(Date.parse(date) + n * DAY);
const daysBetween = (a: string, b: string) => (Date.parse(b) - Date.parse(a)) / DAY;
/** Rounded to 1/per (per = 10: tenths), without the float residue a multiplied step leaves. */
const round = (x: number, per: number) => Math.round(x * per) / per;
const rank = (g: Grade | null) => (g ? GRADES.indexOf(g) : -1);
const worse = (a: Grade, b: Grade) => (rank(b) > rank(a) ? b : a);

/** mulberry32 seeded from the object number: each jar's history stays put when another's changes. */
function generator(key: string) {
	let s = [...key].reduce((h, c) => Math.imul(h ^ c.charCodeAt(0), 16_777_619), 2_166_136_261) >>> 0;
	return () => {
		s = (s + 0x6d2b79f5) >>> 0;
		let t = Math.imul(s ^ (s >>> 15), 1 | s);
		t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
		return ((t ^ (t >>> 14)) >>> 0) / 2 ** 32;
	};
}

function addMonths(date: string, months: number): string {
	const [y, m, d] = date.split('-').map(Number) as [number, number, number];
	const last = new Date(Date.UTC(y, m - 1 + months + 1, 0)).getUTCDate();
	return iso(Date.UTC(y, m - 1 + months, Math.min(d, last)));
}

/** The alcohol-meter reading (to 0.1 % vol) that a liquid of this real strength gives at tempC. */
function meterReading(real: number, tempC: number): number {
	let [lo, hi] = [real - 15, real + 15];
	for (let k = 0; k < 50; k++) {
		const mid = (lo + hi) / 2;
		if (realStrengthAt20(mid, tempC) < real) lo = mid;
		else hi = mid;
	}
	return round((lo + hi) / 2, 10);
}

const FALL_MM_YEAR: Record<string, [number, number]> = { silicone: [0.4, 1], gasket: [0.5, 1.2], wax: [1.2, 2.5], pitch: [1.8, 3.5], unknown: [2.5, 4] };
const STRENGTH_FALL_YEAR: Record<string, [number, number]> = { silicone: [0.05, 0.2], gasket: [0.05, 0.2], wax: [0.2, 0.5], pitch: [0.3, 0.7], unknown: [0.4, 0.8] };

type Mode = 'meter' | 'propanol' | 'formalin' | 'unknown';
function modeOf(j: Jar): Mode {
	if (j.preservative_kind === 'ethanol' || j.preservative_kind === 'industrial-spirit') return 'meter';
	if (j.preservative_kind === 'propan-2-ol') return 'propanol';
	if (j.preservative_kind === 'formalin' || j.hazards.some((h) => h.flag === 'formaldehyde')) return 'formalin';
	return 'unknown';
}

const METHOD: Record<Mode, string> = {
	meter: 'Level by steel rule from the inner base; alcohol meter and thermometer in a drawn sample, returned afterwards.',
	propanol: 'Level by steel rule from the inner base.',
	formalin: 'Level by steel rule from the inner base; pH and formaldehyde by test strip on a drawn sample.',
	unknown: 'Level by steel rule from the inner base, outside the jar.',
};
const MODE_NOTE: Partial<Record<Mode, string>> = {
	propanol: 'Propan-2-ol jar: no meter reading, as an alcohol meter does not read propan-2-ol true.',
	unknown: 'Fluid unidentified: level only, no sample taken until it has been tested.',
};

/** Fluid grade from the loss below the fill line, as a share of the inner height (demo thresholds). */
function levelGrade(lossShare: number): Grade {
	return lossShare < 0.04 ? 'good' : lossShare < 0.08 ? 'fair' : lossShare < 0.12 ? 'poor' : 'unacceptable';
}

/**
 * The dates of a jar's checks, oldest first: the latest approved one placed so that its due date
 * lands near the one the record had, earlier ones 6 to 24 months apart within the last 2 to 6
 * years, and an open check, if any, in the last few weeks.
 */
function checkDates(j: Jar, plan: CheckPlan, today: string, guess: Grade, approvedCount: number, rnd: () => number): string[] {
	const target = j.next_check_due ?? addDays(today, 400);
	const last = [addMonths(target, -DEFAULT_INTERVAL_MONTHS[guess]), addDays(today, -21)].sort()[0]!;
	const gaps = Array.from({ length: approvedCount - 1 }, () => 270 + rnd() * 460);
	const sum = gaps.reduce((a, b) => a + b, 0);
	const minSpan = Math.max(180 * gaps.length, daysBetween(addMonths(today, -24), last));
	const maxSpan = Math.min(730 * gaps.length, daysBetween(addMonths(today, -72), last));
	const scale = Math.min(maxSpan, Math.max(minSpan, sum)) / sum;
	const dates = [last];
	for (const g of gaps.reverse()) dates.unshift(addDays(dates[0]!, -Math.round(g * scale)));
	if (plan.newest) {
		const ago = { 'in-review': 3 + Math.floor(rnd() * 18), draft: 1 + Math.floor(rnd() * 5), returned: 14 + Math.floor(rnd() * 10) }[plan.newest];
		dates.push(addDays(today, -ago));
		if (daysBetween(last, dates.at(-1)!) < 14) throw new Error(`${j.object_number}: the open check would follow the last approved one too closely.`);
	}
	return dates;
}

function historyOf(j: Jar, plan: CheckPlan, today: string, users: DemoCheckUsers, guess: Grade): { rows: Row[]; latestApproved: Grade } {
	const rnd = generator(j.object_number);
	const span = (range: [number, number]) => range[0] + rnd() * (range[1] - range[0]);
	const mode = modeOf(j);
	const total = plan.newest ? 3 + Math.floor(rnd() * 2) : 2 + Math.floor(rnd() * 3);
	const approvedCount = plan.newest ? total - 1 : total;
	const dates = checkDates(j, plan, today, guess, approvedCount, rnd);

	const fall = plan.fallMmYear ?? span(FALL_MM_YEAR[j.seal_type] ?? [1, 2]) + (j.closure_type === 'snap-on' ? 0.8 : 0);
	const strengthFall = span(STRENGTH_FALL_YEAR[j.seal_type] ?? [0.2, 0.5]) * (plan.fallMmYear ? 1.5 : 1);
	// Strength as recorded on the label or register; old jars with none are taken to be weaker.
	const recorded = Number(j.preservative_recorded.match(/(\d{2})\s*%/)?.[1] ?? 0);
	const topUpWith = { meter: `${recorded || 70} % ${j.preservative_kind === 'industrial-spirit' ? 'IMS' : 'ethanol'}`, propanol: '50 % propan-2-ol', formalin: '10 % buffered formalin', unknown: '' }[mode];
	const fillLine = Math.round(j.h * (0.9 + rnd() * 0.05));
	let level = fillLine - fall * (0.3 + rnd() * 1.2);
	let strength = (recorded || 67) - 1.5 + rnd() * 2.5;
	let pH = 6.3 + rnd() * 0.7;
	const pHFall = 0.08 + rnd() * 0.17;
	const [tLo, tHi] = j.location === 'SPR-B1' ? [15, 17.5] : j.location === 'GAL-2' ? [20, 24] : [17, 21.5];
	const toxic = j.hazards.some((h) => h.flag !== 'flammable-spirit');
	const mlMm = mlPerMm({ shape: j.container_shape, widthMm: j.w, depthMm: j.d, heightMm: j.h });

	const rows: Row[] = [];
	let latestApproved: Grade = 'good';
	let previous: Record<Part, PartRecord> | null = null;
	for (let i = 0; i < total; i++) {
		const checkedOn = dates[i]!;
		const years = i === 0 ? 0 : daysBetween(dates[i - 1]!, checkedOn) / 365.25;
		level -= fall * years * (0.8 + rnd() * 0.4);
		strength -= strengthFall * years;
		pH = Math.max(5, pH - pHFall * years);
		if (plan.brimMm !== undefined && i === approvedCount - 1) level = j.h - plan.brimMm;
		const state: CheckState = i < approvedCount ? 'approved' : plan.newest!;
		const progress = i / (total - 1);

		const parts = Object.fromEntries(PARTS.map((p): [Part, PartRecord] => [p, { grade: 'good', terms: [], note: '' }])) as Record<Part, PartRecord>;
		for (const fd of plan.findings ?? []) {
			const [a, b] = fd.grades.map((g) => GRADES.indexOf(g)) as [number, number];
			const part = parts[fd.part];
			part.grade = worse(part.grade!, GRADES[Math.round(a + (b - a) * progress)]!);
			part.terms.push(fd.term);
			part.note = fd.note;
		}
		const levelMm = round(level, 2);
		const loss = fillLine - levelMm;
		const fluidPart = parts.fluid;
		const notes = [i === 0 ? plan.firstNote : undefined, MODE_NOTE[mode]];
		if (levelGrade(loss / j.h) !== 'good') {
			fluidPart.grade = worse(fluidPart.grade!, levelGrade(loss / j.h));
			fluidPart.terms.unshift('low level / evaporation');
			if (state !== 'returned') fluidPart.note = [`Level ${loss} mm below the fill line.`, fluidPart.note].filter(Boolean).join(' ');
		}

		let fluid: Row = { readingPercentVol: null, tempC: null, glass: 'soda-lime', formaldehyde: 'not-tested', pH: null, levelMm, method: METHOD[mode], realPercentVol: null };
		if (mode === 'meter') {
			const tempC = round(span([tLo, tHi]), 2);
			const reading = meterReading(strength + (rnd() - 0.5) * 0.3, tempC);
			const real = realStrengthAt20(reading, tempC);
			fluid = { ...fluid, readingPercentVol: reading, tempC, realPercentVol: real };
			if (real < 65) {
				fluidPart.grade = worse(fluidPart.grade!, 'fair');
				fluidPart.note = [fluidPart.note, `Real strength ${real.toFixed(1)} % vol, below the 65 the store aims to keep.`].filter(Boolean).join(' ');
			}
		} else if (mode === 'formalin') {
			fluid = { ...fluid, formaldehyde: 'positive', pH: round(pH, 10) };
			if (pH < 5.5) {
				fluidPart.grade = worse(fluidPart.grade!, 'fair');
				fluidPart.note = [fluidPart.note, `pH ${round(pH, 10).toFixed(1)}: the formalin is turning acidic.`].filter(Boolean).join(' ');
			}
		}

		// Topping up is recorded on the check that found the jar low; the next check starts full again.
		const toBrim = plan.brimMm !== undefined && i === approvedCount - 2;
		const topUp = toBrim || (state === 'approved' && i < total - 1 && loss / j.h >= 0.06 && mode !== 'unknown' && !plan.noTopUp);
		if (topUp) {
			const target = toBrim ? j.h - plan.brimMm! : fillLine;
			const added = `about ${Math.round(((target - levelMm) * mlMm) / 10) * 10} mL`;
			notes.push(toBrim ? `Topped up after this check with ${topUpWith}, nearly to the lid (${added}).` : `Topped up to the fill line after this check with ${topUpWith} (${added}).`);
			strength = (strength * level + (recorded || 70) * (target - level)) / target;
			pH += (7 - pH) * ((target - level) / target);
			level = target;
		}

		// The returned check left the level out; the draft is only started.
		if (state === 'returned') fluid.levelMm = null;
		if (state === 'draft') {
			for (const p of ['fluid', 'specimen', 'mount', 'label'] as const) parts[p] = { grade: null, terms: [], note: '' };
			fluid = { ...fluid, readingPercentVol: null, tempC: null, realPercentVol: null, pH: null, formaldehyde: 'not-tested' };
			notes.push('Started; fluid readings, specimen, mount and label still to do.');
		}
		// Say what changed since the last check, part by part (only parts graded both times).
		const moved = (dir: number) =>
			PARTS.filter((p) => previous && rank(parts[p].grade) >= 0 && rank(previous[p].grade) >= 0 && Math.sign(rank(parts[p].grade) - rank(previous[p].grade)) === dir).map((p) =>
				CHECK_LABELS.part[p].toLowerCase(),
			);
		if (moved(1).length) notes.push(`Worse since the last check: ${moved(1).join(', ')}.`);
		if (moved(-1).length) notes.push(`Better since the last check: ${moved(-1).join(', ')}.`);
		previous = parts;
		const overall = worstGrade(PARTS.map((p) => parts[p].grade));
		if (state === 'approved') latestApproved = overall!;
		if (notes.every((n) => !n)) notes.push(overall === 'good' ? 'Sound; nothing to report.' : i === 0 ? 'Routine survey.' : 'No marked change since the last check.');

		const submitted = state === 'draft' ? null : at(addDays(checkedOn, Math.floor(rnd() * 2)), 16);
		const reviewed = state === 'approved' || state === 'returned' ? at(addDays(checkedOn, 2 + Math.floor(rnd() * 5)), 11) : null;
		const created = at(checkedOn, 9);
		rows.push({
			specimen_id: j.id,
			checked_on: checkedOn,
			examiner_id: users.conservatorId,
			reason: i === 0 && plan.firstReason ? plan.firstReason : 'routine-survey',
			state,
			parts: JSON.stringify(parts),
			overall_grade: overall,
			priority: state === 'draft' ? null : suggestedPriority(overall, toxic),
			next_check_due: overall ? nextCheckDue(checkedOn, overall) : null,
			notes: notes.filter(Boolean).join(' '),
			fluid: JSON.stringify(fluid),
			submitted_at: submitted,
			reviewer_id: reviewed ? users.reviewerId : null,
			reviewed_at: reviewed,
			review_comment:
				state === 'returned' ? (plan.reviewComment ?? 'No fluid level recorded: measure it from the inner base, add it and submit again.') : null,
			version: 0,
			created_at: created,
			updated_at: reviewed ?? submitted ?? created,
		});
	}
	return { rows, latestApproved };
}

export type DemoCheckUsers = { conservatorId: string; reviewerId: string };

/** Inserts the demo checks and writes each jar's latest approved condition onto its record. */
export async function seedDemoChecks(sequelize: Sequelize, transaction: Transaction, opts: { today: Date; users: DemoCheckUsers }): Promise<number> {
	const today = iso(opts.today.getTime());
	const jars = await sequelize.query<Jar>(
		`SELECT s.id, s.object_number, s.preservative_kind, s.preservative_recorded, s.container_shape, s.inner_width_mm::float8 AS w,
		        s.inner_depth_mm::float8 AS d, s.inner_height_mm::float8 AS h, s.seal_type, s.closure_type, s.hazards,
		        s.next_check_due::text AS next_check_due, l.code AS location
		 FROM specimens s LEFT JOIN storage_locations l ON l.id = s.storage_location_id ORDER BY s.object_number`,
		{ type: QueryTypes.SELECT, transaction },
	);
	const rows: Row[] = [];
	for (const j of jars) {
		const plan = CHECK_PLANS[j.object_number] ?? {};
		// The placement depends on the grade the history ends with, so settle it in a few rounds.
		let guess: Grade = 'good';
		let h = historyOf(j, plan, today, opts.users, guess);
		for (let k = 0; k < 4 && h.latestApproved !== guess; k++) h = historyOf(j, plan, today, opts.users, (guess = h.latestApproved));
		rows.push(...h.rows);
	}
	if (rows.length) await sequelize.getQueryInterface().bulkInsert('condition_checks', rows, { transaction });
	// The trail each demo check would have left had it been made in the app.
	await sequelize.query(
		`INSERT INTO audit_events (occurred_at, actor_id, action, entity_type, entity_id, after)
		 SELECT checked_on + time '09:30', examiner_id, 'check.open', 'check', id::text, jsonb_build_object('specimenId', specimen_id) FROM condition_checks
		 UNION ALL
		 SELECT submitted_at, examiner_id, 'check.submit', 'check', id::text, jsonb_build_object('state', 'in-review') FROM condition_checks WHERE submitted_at IS NOT NULL
		 UNION ALL
		 SELECT reviewed_at, reviewer_id, CASE state WHEN 'approved' THEN 'check.approve' ELSE 'check.return' END, 'check', id::text,
		        jsonb_build_object('state', state, 'comment', coalesce(review_comment, ''))
		 FROM condition_checks WHERE state IN ('approved', 'returned')`,
		{ transaction },
	);
	await sequelize.query(
		`UPDATE specimens s SET current_grade = c.overall_grade, current_priority = c.priority, last_checked_on = c.checked_on, next_check_due = c.next_check_due
		 FROM (SELECT DISTINCT ON (specimen_id) specimen_id, overall_grade, priority, checked_on, next_check_due
		       FROM condition_checks WHERE state = 'approved' ORDER BY specimen_id, checked_on DESC, reviewed_at DESC) c
		 WHERE s.id = c.specimen_id`,
		{ transaction },
	);
	return rows.length;
}
