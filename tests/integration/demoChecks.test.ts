import { beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { useTestDatabase } from '../helpers/server.ts';
import { db } from '../../src/lib/server/db.ts';
import { worstGrade } from '../../src/lib/check/grading.ts';
import { PARTS, type Grade, type Part } from '../../src/lib/check/vocabulary.ts';
import { realStrengthAt20 } from '../../src/lib/fluid/alcoholometry.ts';
import type { PartRecord, StoredFluid } from '../../src/lib/server/models/ConditionCheck.ts';

/**
 * The demo history the global setup seeded. Other test files add their own specimens and checks,
 * so everything here is limited to the demo's object numbers (STC.…).
 */
type Check = {
	object_number: string;
	preservative_kind: string;
	inner_height_mm: number;
	checked_on: string;
	state: string;
	examiner_id: string;
	reviewer_id: string | null;
	submitted_at: Date | null;
	reviewed_at: Date | null;
	overall_grade: Grade | null;
	parts: Record<Part, PartRecord>;
	fluid: StoredFluid | null;
	notes: string;
};
type Jar = { object_number: string; current_grade: Grade | null; current_priority: string | null; last_checked_on: string | null; next_check_due: string | null };

let checks: Check[] = [];
let jars: Jar[] = [];
const byJar = new Map<string, Check[]>();

beforeAll(async () => {
	useTestDatabase();
	// Ordered as the app orders a jar's checks: by the date checked, oldest first here.
	checks = await db().query<Check>(
		`SELECT s.object_number, s.preservative_kind, s.inner_height_mm::float8 AS inner_height_mm, c.checked_on::text AS checked_on, c.state,
		        c.examiner_id, c.reviewer_id, c.submitted_at, c.reviewed_at, c.overall_grade, c.parts, c.fluid, c.notes
		 FROM condition_checks c JOIN specimens s ON s.id = c.specimen_id
		 WHERE s.object_number LIKE 'STC.%' ORDER BY s.object_number, c.checked_on, c.created_at`,
		{ type: QueryTypes.SELECT },
	);
	jars = await db().query<Jar>(
		`SELECT object_number, current_grade, current_priority, last_checked_on::text AS last_checked_on, next_check_due::text AS next_check_due
		 FROM specimens WHERE object_number LIKE 'STC.%' ORDER BY object_number`,
		{ type: QueryTypes.SELECT },
	);
	for (const c of checks) byJar.set(c.object_number, [...(byJar.get(c.object_number) ?? []), c]);
});

describe('the demo condition checks', () => {
	it('give every demo jar two to four checks, all but the newest approved', () => {
		expect(jars).toHaveLength(30);
		for (const j of jars) {
			const list = byJar.get(j.object_number) ?? [];
			expect(list.length, j.object_number).toBeGreaterThanOrEqual(2);
			expect(list.length, j.object_number).toBeLessThanOrEqual(4);
			expect(list.slice(0, -1).every((c) => c.state === 'approved'), j.object_number).toBe(true);
		}
	});

	it('have approved checks reviewed by someone other than the examiner, after submission', () => {
		for (const c of checks.filter((c) => c.state === 'approved')) {
			expect(c.reviewer_id).toBeTruthy();
			expect(c.reviewer_id).not.toBe(c.examiner_id);
			expect(c.submitted_at!.getTime()).toBeLessThan(c.reviewed_at!.getTime());
		}
	});

	it('leave one check returned, at least four in review and at least two drafts', () => {
		const count = (state: string) => checks.filter((c) => c.state === state).length;
		expect(count('returned')).toBe(1);
		expect(count('in-review')).toBeGreaterThanOrEqual(4);
		expect(count('draft')).toBeGreaterThanOrEqual(2);
		const returned = checks.find((c) => c.state === 'returned')!;
		expect(returned.reviewer_id).toBeTruthy();
		expect(checks.filter((c) => c.state === 'in-review').every((c) => c.submitted_at && !c.reviewer_id)).toBe(true);
		expect(checks.filter((c) => c.state === 'draft').every((c) => !c.submitted_at)).toBe(true);
	});

	it('store the real strength the OIML R 22 correction gives for every meter reading', () => {
		for (const [jar, list] of byJar) {
			const readings = list.filter((c) => c.fluid?.readingPercentVol != null);
			// Ethanol and IMS jars are read with the meter; propan-2-ol, formalin and unknown fluids never are.
			if (['ethanol', 'industrial-spirit'].includes(list[0]!.preservative_kind)) expect(readings.length, jar).toBeGreaterThanOrEqual(2);
			else expect(readings, jar).toHaveLength(0);
			for (const c of readings) {
				const f = c.fluid!;
				expect(Math.abs(f.realPercentVol! - realStrengthAt20(f.readingPercentVol!, f.tempC!, f.glass)), jar).toBeLessThan(1e-9);
			}
		}
	});

	it('keep levels inside the jar and falling, unless the jar was topped up', () => {
		for (const [jar, list] of byJar) {
			for (const c of list) if (c.fluid?.levelMm != null) expect(c.fluid.levelMm, jar).toBeLessThanOrEqual(c.inner_height_mm);
			const levelled = list.filter((c) => c.fluid?.levelMm != null);
			for (let i = 1; i < levelled.length; i++) {
				if (/topped up/i.test(levelled[i - 1]!.notes)) continue;
				expect(levelled[i]!.fluid!.levelMm!, jar).toBeLessThan(levelled[i - 1]!.fluid!.levelMm!);
			}
		}
	});

	it('grade every check overall as its worst part', () => {
		for (const c of checks) expect(c.overall_grade, c.object_number).toBe(worstGrade(PARTS.map((p) => c.parts[p].grade)));
	});

	it('put each jar’s latest approved condition on its record', async () => {
		const latest = await db().query<{ object_number: string; overall_grade: Grade; priority: string; checked_on: string; next_check_due: string }>(
			`SELECT DISTINCT ON (s.id) s.object_number, c.overall_grade, c.priority, c.checked_on::text AS checked_on, c.next_check_due::text AS next_check_due
			 FROM condition_checks c JOIN specimens s ON s.id = c.specimen_id
			 WHERE s.object_number LIKE 'STC.%' AND c.state = 'approved' ORDER BY s.id, c.checked_on DESC, c.reviewed_at DESC`,
			{ type: QueryTypes.SELECT },
		);
		const of = new Map(latest.map((l) => [l.object_number, l]));
		for (const j of jars) {
			const l = of.get(j.object_number)!;
			expect(j, j.object_number).toEqual({ object_number: j.object_number, current_grade: l.overall_grade, current_priority: l.priority, last_checked_on: l.checked_on, next_check_due: l.next_check_due });
		}
	});
});

describe('the demo checks’ trail', () => {
	it('has an opening event for every demo check and an approval for every approved one', async () => {
		const { AuditEvent, ConditionCheck } = await import('../../src/lib/server/models/index.ts');
		const approved = await ConditionCheck.findAll({ where: { state: 'approved' }, limit: 20 });
		for (const c of approved) {
			const actions = (await AuditEvent.findAll({ where: { entityType: 'check', entityId: c.id } })).map((e) => e.action).sort();
			expect(actions).toEqual(expect.arrayContaining(['check.approve', 'check.open', 'check.submit']));
		}
	});
});
