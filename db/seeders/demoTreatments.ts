import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { templatePlan } from '../../src/lib/treatment/plan.ts';
import type { EditBody } from '../../src/lib/treatment/edit.ts';
import type { StepView } from '../../src/lib/treatment/view.ts';
import type { SealType } from '../../src/lib/specimen/vocabulary.ts';
import { realStrengthAt20 } from '../../src/lib/fluid/alcoholometry.ts';

/**
 * Two demo treatments, so the treatment pages and the review queue have something on first start:
 * the showcase jar's failing pitch seal, planned and waiting for the reviewer's sign-off of its risk
 * assessment; and a silicone-sealed spirit jar re-jarred two years ago, between two approved
 * checks, with its record complete. Invented for the demo, like every demo record.
 */
type Ids = { conservatorId: string; reviewerId: string };
type Risk = EditBody['risk'];

/** Step ids for a demo plan: stable, so the demo is the same every time. */
const stepIds = () => {
	let i = 0;
	return () => `demo${String(i++).padStart(2, '0')}`;
};

const showcaseRisk: Risk = {
	hazards: [
		{ id: 'h1', kind: 'flammable-spirit', description: 'About 1 L of spirit in the jar; opened in the wet lab.', inherent: { likelihood: 3, severity: 4 }, controls: ['no-ignition', 'minimum-quantity', 'lev', 'spill-kit', 'tray'], otherControls: '', residual: { likelihood: 1, severity: 4 } },
		{ id: 'h2', kind: 'historic-seal', description: 'Original black seal, probably coal-tar pitch.', inherent: { likelihood: 4, severity: 3 }, controls: ['gloves-nitrile', 'lev', 'closed-waste'], otherControls: 'Scrapings bagged for hazardous waste.', residual: { likelihood: 2, severity: 3 } },
		{ id: 'h3', kind: 'heated-tools', description: 'Warm spatula to soften the pitch.', inherent: { likelihood: 3, severity: 3 }, controls: ['gloves-heat', 'let-cool', 'no-ignition'], otherControls: 'Spatula heated outside the fume cupboard, away from the open jar.', residual: { likelihood: 2, severity: 2 } },
		{ id: 'h4', kind: 'glass', description: '1898 jar; check the rim for chips before lifting the lid.', inherent: { likelihood: 2, severity: 3 }, controls: ['gloves-cut', 'eye-protection', 'tray'], otherControls: '', residual: { likelihood: 1, severity: 3 } },
	],
	dismissed: [],
	notes: 'The fluid will be tested before the seal is opened further.',
};

const doneRisk: Risk = {
	hazards: [
		{ id: 'h1', kind: 'flammable-spirit', description: 'About 1.5 L of spirit in the jar.', inherent: { likelihood: 3, severity: 4 }, controls: ['no-ignition', 'minimum-quantity', 'lev', 'spill-kit'], otherControls: '', residual: { likelihood: 1, severity: 4 } },
		{ id: 'h2', kind: 'glass', description: 'Handling the jar and the new jar.', inherent: { likelihood: 2, severity: 3 }, controls: ['gloves-cut', 'eye-protection', 'two-people'], otherControls: '', residual: { likelihood: 1, severity: 3 } },
	],
	dismissed: [],
	notes: '',
};

const at = (date: string, hour: number, minute = 0) => new Date(`${date}T${String(hour).padStart(2, '0')}:${String(minute).padStart(2, '0')}:00.000Z`).toISOString();

function completedSteps(seal: SealType, date: string, nextDay: string, by: string, silicone: { id: string; name: string }): StepView[] {
	const plan = templatePlan(seal, stepIds());
	const minutes: Record<string, number> = { 'photograph-before': 10, 'identify-fluid': 15, 'open-seal': 20, 'drain-fluid': 10, 'lift-specimen': 10, 'clean-rim': 25, remount: 40, refill: 15, seal: 15, cure: 0, 'finish-seal': 10, 'photograph-after': 10, record: 20 };
	let clock = 9 * 60;
	let second = false;
	return plan.map((s) => {
		const day = s.kind === 'finish-seal' || s.kind === 'photograph-after' || s.kind === 'record' ? nextDay : date;
		// The next day's work starts after the silicone's 24 h have passed (it went on before noon).
		if (day === nextDay && !second) [clock, second] = [13 * 60, true];
		const start = at(day, Math.floor(clock / 60), clock % 60);
		clock += minutes[s.kind] ?? 10;
		const finish = at(day, Math.floor(clock / 60), clock % 60);
		const base = { ...s, status: 'done' as const, doneBy: by, startedAt: start, finishedAt: finish, minutes: minutes[s.kind] ?? null, materials: [] as StepView['materials'] };
		if (s.kind === 'cure') return { ...base, startedAt: start, finishedAt: at(nextDay, 12, 30), minutes: null, notes: 'Left overnight in the fume cupboard.' };
		if (s.kind === 'remount') return { ...base, materials: [{ kind: 'thread', materialId: null, name: 'Polyester thread', amount: '0.5 m', appliedAt: null, fluid: null, cureHours: null }], notes: 'Two new suspension threads; old cotton threads kept with the record.' };
		if (s.kind === 'refill') {
			return {
				...base,
				materials: [{ kind: 'fluid', materialId: null, name: 'Ethanol, made to 70 % vol', amount: '1.4 L', appliedAt: null, cureHours: null, fluid: { batch: 'STC-F-24-07', preservativeKind: 'ethanol', statedPercentVol: 70, readingPercentVol: 70.6, tempC: 21, glass: 'soda-lime', realPercentVol: realStrengthAt20(70.6, 21) } }],
				notes: 'Filled to about 15 mm below the lid.',
			};
		}
		if (s.kind === 'seal') return { ...base, materials: [{ kind: 'sealant', materialId: silicone.id, name: silicone.name, amount: 'one bead', appliedAt: start, fluid: null, cureHours: 24 }] };
		return base;
	});
}

export async function seedDemoTreatments(sequelize: Sequelize, transaction: Transaction, users: Ids, today: Date): Promise<number> {
	const q = <T extends object>(sql: string, replacements: Record<string, unknown> = {}) => sequelize.query<T>(sql, { type: QueryTypes.SELECT, transaction, replacements });
	const [silicone] = await q<{ id: string; name: string }>(`SELECT id, name FROM treatment_materials WHERE name = 'Neutral-cure silicone sealant'`);
	const [showcase] = await q<{ id: string; seal_type: SealType; check_id: string | null }>(
		`SELECT s.id, s.seal_type, (SELECT c.id FROM condition_checks c WHERE c.specimen_id = s.id ORDER BY c.checked_on DESC LIMIT 1) AS check_id
		 FROM specimens s WHERE s.object_number = 'STC.1898.014'`,
	);
	// A spirit jar sealed with silicone whose last two checks are approved: the treatment sat between them.
	const [done] = await q<{ id: string; seal_type: SealType; before_id: string; before_on: string; after_id: string; after_on: string }>(
		`SELECT s.id, s.seal_type, b.id AS before_id, b.checked_on::text AS before_on, a.id AS after_id, a.checked_on::text AS after_on
		 FROM specimens s
		 JOIN LATERAL (SELECT id, checked_on FROM condition_checks WHERE specimen_id = s.id AND state = 'approved' ORDER BY checked_on DESC LIMIT 1) a ON true
		 JOIN LATERAL (SELECT id, checked_on FROM condition_checks WHERE specimen_id = s.id AND state = 'approved' AND checked_on < a.checked_on ORDER BY checked_on DESC LIMIT 1) b ON true
		 WHERE s.preservative_kind = 'ethanol' AND s.seal_type = 'silicone' AND s.object_number <> 'STC.1898.014'
		 ORDER BY s.object_number LIMIT 1`,
	);
	const rows: Record<string, unknown>[] = [];
	const stamp = (d: Date) => ({ created_at: d, updated_at: d });
	if (showcase && silicone) {
		const submitted = new Date(today.getTime() - 2 * 86_400_000);
		const [first, ...rest] = templatePlan(showcase.seal_type, stepIds());
		// Photographed before the plan went for sign-off; nothing else has started.
		const steps: StepView[] = [{ ...first!, status: 'done', doneBy: users.conservatorId, finishedAt: submitted.toISOString(), minutes: 10 }, ...rest];
		rows.push({
			specimen_id: showcase.id, title: 'Replace the failing pitch seal', purpose: 'The pitch seal has cracked along a third of the rim and the level is falling. Open, clean the rim, reseal with silicone, top up to the original level.',
			before_check_id: showcase.check_id, after_check_id: null, state: 'planning', steps: JSON.stringify(steps), risk: JSON.stringify(showcaseRisk),
			risk_state: 'in-review', risk_submitted_at: submitted, risk_reviewer_id: null, risk_reviewed_at: null, risk_review_comment: null, completed_at: null,
			created_by: users.conservatorId, updated_by: users.conservatorId, version: 3, ...stamp(new Date(submitted.getTime() - 3_600_000)),
		});
	}
	if (done && silicone) {
		const date = new Date(Date.parse(done.before_on) + 7 * 86_400_000).toISOString().slice(0, 10);
		const nextDay = new Date(Date.parse(date) + 86_400_000).toISOString().slice(0, 10);
		const planned = new Date(`${done.before_on}T15:00:00Z`);
		rows.push({
			specimen_id: done.id, title: 'Re-jar into a new jar', purpose: 'Weeping glass on the old jar; moved into a new jar of the same size.', before_check_id: done.before_id, after_check_id: done.after_id,
			state: 'completed', steps: JSON.stringify(completedSteps(done.seal_type, date, nextDay, users.conservatorId, silicone)), risk: JSON.stringify(doneRisk),
			risk_state: 'signed-off', risk_submitted_at: new Date(planned.getTime() + 3_600_000), risk_reviewer_id: users.reviewerId, risk_reviewed_at: new Date(planned.getTime() + 20 * 3_600_000), risk_review_comment: null,
			completed_at: new Date(`${nextDay}T12:00:00Z`), created_by: users.conservatorId, updated_by: users.conservatorId, version: 9, created_at: planned, updated_at: new Date(`${nextDay}T12:00:00Z`),
		});
	}
	if (rows.length) await sequelize.getQueryInterface().bulkInsert('treatments', rows, { transaction });
	return rows.length;
}
