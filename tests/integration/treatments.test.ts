import { beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { QueryTypes } from 'sequelize';
import { call, useTestDatabase } from '../helpers/server.ts';
import { signedInUser } from '../helpers/users.ts';
import { reportOf } from '../helpers/pdf.ts';
import { newSpecimen } from '../helpers/checks.ts';
import { bodyOf, coveringRisk, openTreatment, saveTreatment } from '../helpers/treatments.ts';
import { db } from '../../src/lib/server/db.ts';
import { OutgoingMail } from '../../src/lib/server/models/index.ts';
import type { TreatmentView } from '../../src/lib/treatment/view.ts';
import { TREATMENT_EXPORT_COLUMNS } from '../../src/lib/server/treatments/csv.ts';
import { TreatmentBodySchema } from '../../src/lib/treatment/schema.ts';
import { bodyFromView } from '../../src/lib/treatment/edit.ts';

/**
 * Treatments over HTTP (issue 8): the starting plan and the hazards the record suggests; the
 * reviewer's sign-off gating the work steps; cure-time warnings from the materials list; the state
 * and permission rules; the treatments CSV.
 */
type Who = { id: string; cookie: string };
let author: Who, colleague: Who, reviewer: Who, curator: Who, admin: Who;
let specimen: { id: string; objectNumber: string };

beforeAll(async () => {
	useTestDatabase();
	db();
	author = await signedInUser('conservator', 'tr-author');
	colleague = await signedInUser('conservator', 'tr-colleague');
	reviewer = await signedInUser('reviewer', 'tr-reviewer');
	curator = await signedInUser('curator', 'tr-curator');
	admin = await signedInUser('admin', 'tr-admin');
	specimen = await newSpecimen(author.cookie, `TR${process.pid}`);
});

const json = async (res: Response) => ({ status: res.status, body: await res.json() });
const step = (t: TreatmentView, kind: string) => t.steps.find((s) => s.kind === kind)!;

async function signedOff(): Promise<TreatmentView> {
	const t = await openTreatment(author.cookie, specimen.id);
	const saved = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => (b.risk = coveringRisk(t)))));
	expect(saved.status).toBe(200);
	const sub = await json(await call(`/api/treatments/${t.id}/risk-submit`, { cookie: author.cookie, json: { version: saved.body.treatment.version } }));
	expect(sub.status).toBe(200);
	const rev = await json(await call(`/api/treatments/${t.id}/risk-review`, { cookie: reviewer.cookie, json: { decision: 'sign-off', comment: '' } }));
	expect(rev.status).toBe(200);
	return rev.body.treatment;
}

describe('planning a treatment', () => {
	it('starts from the re-jarring outline with the hazards the record suggests', async () => {
		const t = await openTreatment(author.cookie, specimen.id);
		expect(t.state).toBe('planning');
		expect(t.riskState).toBe('draft');
		expect(t.steps.map((s) => s.kind)).toEqual(['photograph-before', 'identify-fluid', 'open-seal', 'drain-fluid', 'lift-specimen', 'clean-rim', 'remount', 'refill', 'seal', 'cure', 'finish-seal', 'photograph-after', 'record']);
		// An ethanol jar, 80 mm × 160 mm, no level on record: π × 40² × 160 mm³ ≈ 0.8 L, counted full.
		expect(t.suggested.map((h) => h.kind)).toEqual(['flammable-spirit', 'glass']);
		expect(t.suggested[0]!.reason).toContain('About 804 mL');
		expect(t.riskProblems).toContain('Assess at least one hazard.');
	});

	it('refuses a plan from a curator or a reviewer, and a check of another specimen', async () => {
		const t = await openTreatment(author.cookie, specimen.id);
		expect((await saveTreatment(curator.cookie, t, bodyOf(t))).status).toBe(403);
		expect((await saveTreatment(reviewer.cookie, t, bodyOf(t))).status).toBe(403);
		expect((await call(`/api/specimens/${specimen.id}/treatments`, { cookie: reviewer.cookie, json: { title: 'x' } })).status).toBe(403);
		const other = await newSpecimen(author.cookie, `TO${process.pid}`);
		const opened = await json(await call(`/api/specimens/${other.id}/checks`, { cookie: author.cookie, json: {} }));
		const res = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => (b.afterCheckId = opened.body.check.id))));
		expect(res.status).toBe(400);
		expect(res.body.error).toMatch(/condition check of this specimen/);
	});

	it('answers a stale save with 409 and the current record, changing nothing', async () => {
		const t = await openTreatment(author.cookie, specimen.id);
		expect((await saveTreatment(colleague.cookie, t, bodyOf(t, (b) => (b.purpose = 'First')))).status).toBe(200);
		const res = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => (b.purpose = 'Second'))));
		expect(res.status).toBe(409);
		expect(res.body.current.purpose).toBe('First');
	});

	it('refuses bad input with a clear error', async () => {
		const t = await openTreatment(author.cookie, specimen.id);
		const bad = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => (b.risk.hazards = [{ ...coveringRisk(t).hazards[0]!, inherent: { likelihood: 6 as 5, severity: 2 } }]))));
		expect(bad.status).toBe(400);
		expect(JSON.stringify(bad.body)).toMatch(/Likelihood is a whole number from 1 to 5/);
		const future = new Date(Date.now() + 3_600_000).toISOString();
		const early = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => Object.assign(b.steps[0]!, { status: 'done', finishedAt: future }))));
		expect(early.status).toBe(400);
		expect(early.body.error).toMatch(/future/);
	});
});

describe('the risk assessment and its sign-off', () => {
	it('gates the work steps until a reviewer signs off', async () => {
		const t = await openTreatment(author.cookie, specimen.id);
		// Photographing the closed jar is not gated.
		const photo = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => (b.steps[0]!.status = 'done'))));
		expect(photo.status).toBe(200);
		expect(photo.body.treatment.steps[0].finishedAt).not.toBeNull();
		expect(photo.body.treatment.steps[0].doneBy).toBe(author.id);
		const t1: TreatmentView = photo.body.treatment;
		const open = await json(await saveTreatment(author.cookie, t1, bodyOf(t1, (b) => (b.steps[2]!.status = 'started'))));
		expect(open.status).toBe(403);
		expect(open.body.error).toMatch(/cannot be started before a reviewer has signed off/);
		// Refused before sign-off: nothing written.
		expect((await json(await call(`/api/treatments/${t.id}`, { cookie: author.cookie }))).body.treatment.version).toBe(t1.version);
	});

	it('goes for sign-off only when every suggestion is assessed or dismissed, and mails the reviewers', async () => {
		const t = await openTreatment(author.cookie, specimen.id);
		const half = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => (b.risk = { ...coveringRisk(t), hazards: coveringRisk(t).hazards.slice(1) }))));
		const refused = await json(await call(`/api/treatments/${t.id}/risk-submit`, { cookie: author.cookie, json: { version: half.body.treatment.version } }));
		expect(refused.status).toBe(400);
		expect(refused.body.problems.join(' ')).toMatch(/Flammable spirit/);
		const t2: TreatmentView = half.body.treatment;
		const full = await json(await saveTreatment(author.cookie, t2, bodyOf(t2, (b) => (b.risk.dismissed = [{ kind: 'flammable-spirit', reason: 'Fluid tested: it is glycerol, not spirit.' }]))));
		const sub = await json(await call(`/api/treatments/${t.id}/risk-submit`, { cookie: author.cookie, json: { version: full.body.treatment.version } }));
		expect(sub.status).toBe(200);
		expect(sub.body.treatment.riskState).toBe('in-review');
		const mail = await OutgoingMail.findAll({ where: { subject: `Risk assessment for ${specimen.objectNumber} waiting for sign-off` } });
		const to = mail.map((m) => m.toAddress);
		expect(to.length).toBeGreaterThan(0);
		// While it waits, the assessment cannot change; the queue lists it.
		const frozen = await saveTreatment(author.cookie, sub.body.treatment, bodyOf(sub.body.treatment, (b) => (b.risk.notes = 'late change')));
		expect(frozen.status).toBe(403);
		const queue = await json(await call('/api/treatments?view=queue', { cookie: reviewer.cookie }));
		expect(queue.body.treatments.map((x: { id: string }) => x.id)).toContain(t.id);
	});

	it('lets only a reviewer sign off, never on a very-high residual, and returns need a comment', async () => {
		const t = await openTreatment(author.cookie, specimen.id);
		const saved = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => (b.risk = coveringRisk(t)))));
		await call(`/api/treatments/${t.id}/risk-submit`, { cookie: author.cookie, json: { version: saved.body.treatment.version } });
		expect((await call(`/api/treatments/${t.id}/risk-review`, { cookie: colleague.cookie, json: { decision: 'sign-off' } })).status).toBe(403);
		expect((await call(`/api/treatments/${t.id}/risk-review`, { cookie: reviewer.cookie, json: { decision: 'return', comment: '' } })).status).toBe(400);
		const back = await json(await call(`/api/treatments/${t.id}/risk-review`, { cookie: reviewer.cookie, json: { decision: 'return', comment: 'Add the spill kit to the spirit controls.' } }));
		expect(back.body.treatment.riskState).toBe('returned');
		const mail = await OutgoingMail.findAll({ where: { subject: `Risk assessment for ${specimen.objectNumber} returned with comments` } });
		expect(mail.length).toBeGreaterThan(0);
		// A very-high residual cannot go for sign-off.
		const r: TreatmentView = back.body.treatment;
		const worse = await json(await saveTreatment(author.cookie, r, bodyOf(r, (b) => (b.risk.hazards[0]!.inherent = { likelihood: 5, severity: 5 }, b.risk.hazards[0]!.residual = { likelihood: 4, severity: 5 }))));
		const sub = await json(await call(`/api/treatments/${t.id}/risk-submit`, { cookie: author.cookie, json: { version: worse.body.treatment.version } }));
		expect(sub.status).toBe(400);
		expect(sub.body.error).toMatch(/very high/);
	});

	it('voids the sign-off when the assessed hazards change, and gates new steps again', async () => {
		const t = await signedOff();
		const started = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => (b.steps[1]!.status = 'started'))));
		expect(started.status).toBe(200);
		expect(started.body.treatment.state).toBe('in-progress');
		const s: TreatmentView = started.body.treatment;
		const changed = await json(await saveTreatment(author.cookie, s, bodyOf(s, (b) => (b.risk.hazards[0]!.controls = [...b.risk.hazards[0]!.controls, 'spill-kit']))));
		expect(changed.status).toBe(200);
		expect(changed.body.treatment.riskState).toBe('draft');
		const c: TreatmentView = changed.body.treatment;
		// The step begun under the sign-off may be finished; the next may not start.
		expect((await saveTreatment(author.cookie, c, bodyOf(c, (b) => (b.steps[1]!.status = 'done')))).status).toBe(200);
		const again = await json(await call(`/api/treatments/${t.id}`, { cookie: author.cookie }));
		const a: TreatmentView = again.body.treatment;
		expect((await saveTreatment(author.cookie, a, bodyOf(a, (b) => (b.steps[2]!.status = 'started')))).status).toBe(403);
	});
});

describe('cure timers', () => {
	it('shows when the jar may be disturbed and warns the next steps until then', async () => {
		const t = await signedOff();
		const list = await json(await call('/api/treatment-materials', { cookie: author.cookie }));
		const silicone = list.body.materials.find((m: { name: string }) => m.name === 'Neutral-cure silicone sealant');
		expect(silicone.cureHours).toBe(24);
		const applied = new Date(Date.now() - 2 * 3_600_000).toISOString();
		const res = await json(
			await saveTreatment(author.cookie, t, bodyOf(t, (b) => {
				const seal = b.steps.find((s) => s.kind === 'seal')!;
				Object.assign(seal, { status: 'done', materials: [{ kind: 'sealant', materialId: silicone.id, name: '', amount: 'one bead', appliedAt: applied, fluid: null }] });
			})),
		);
		expect(res.status).toBe(200);
		const v: TreatmentView = res.body.treatment;
		expect(step(v, 'seal').materials[0]!.cureHours).toBe(24);
		expect(step(v, 'seal').materials[0]!.name).toBe('Neutral-cure silicone sealant');
		expect(v.cure.mayDisturbAt).toBe(new Date(Date.parse(applied) + 24 * 3_600_000).toISOString());
		const warned = v.cure.warnings.filter((w) => w.kind === 'wait').map((w) => w.stepId);
		expect(warned).toContain(step(v, 'finish-seal').id);
		expect(warned).toContain(step(v, 'photograph-after').id);
		// An administrator changing the list later does not rewrite the record.
		expect((await call(`/api/treatment-materials/${silicone.id}`, { cookie: admin.cookie, method: 'PATCH', json: { cureHours: 48 } })).status).toBe(200);
		const after = await json(await saveTreatment(author.cookie, v, bodyOf(v, (b) => (b.purpose = 'note'))));
		expect(step(after.body.treatment, 'seal').materials[0]!.cureHours).toBe(24);
		await call(`/api/treatment-materials/${silicone.id}`, { cookie: admin.cookie, method: 'PATCH', json: { cureHours: 24 } });
	});

	it('computes the real strength of a fluid batch from its meter reading', async () => {
		const t = await signedOff();
		const res = await json(
			await saveTreatment(author.cookie, t, bodyOf(t, (b) => {
				const refill = b.steps.find((s) => s.kind === 'refill')!;
				Object.assign(refill, { status: 'done', materials: [{ kind: 'fluid', materialId: null, name: '70 % ethanol', amount: '0.7 L', appliedAt: null, fluid: { batch: 'B-26-031', preservativeKind: 'ethanol', statedPercentVol: 70, readingPercentVol: 70, tempC: 25, glass: 'soda-lime' } }] });
			})),
		);
		expect(res.status).toBe(200);
		// TRADE.md [S77]: 70 % vol read at 25 °C is about 68 % vol real (the OIML R 22 formula gives 68.35).
		expect(step(res.body.treatment, 'refill').materials[0]!.fluid!.realPercentVol).toBeCloseTo(68.35, 1);
	});
});

describe('completing a treatment', () => {
	it('needs every step finished or not needed and the after check, then never changes', async () => {
		const t = await signedOff();
		const refused = await json(await call(`/api/treatments/${t.id}/close`, { cookie: author.cookie, json: { version: t.version, how: 'complete' } }));
		expect(refused.status).toBe(400);
		expect(refused.body.problems).toHaveLength(2);
		const after = await json(await call(`/api/specimens/${specimen.id}/checks`, { cookie: author.cookie, json: {} }));
		const now = new Date().toISOString();
		const done = await json(await saveTreatment(author.cookie, t, bodyOf(t, (b) => {
			b.afterCheckId = after.body.check.id;
			for (const s of b.steps) Object.assign(s, s.kind === 'cure' ? { status: 'skipped' } : { status: 'done', finishedAt: now });
		})));
		expect(done.status).toBe(200);
		const closed = await json(await call(`/api/treatments/${t.id}/close`, { cookie: author.cookie, json: { version: done.body.treatment.version, how: 'complete' } }));
		expect(closed.status).toBe(200);
		expect(closed.body.treatment.state).toBe('completed');
		const d: TreatmentView = closed.body.treatment;
		expect((await saveTreatment(author.cookie, d, bodyOf(d))).status).toBe(403);
		// The after check's condition report carries the treatment: plan, record, assessment, sign-off.
		const { res, pages } = await reportOf(after.body.check.id, curator.cookie);
		expect(res.status).toBe(200);
		const text = pages.join('\n');
		for (const words of ['Treatment', 'Re-jar and reseal (completed)', 'After treatment', 'Signed off', 'Test reviewer', 'Flammable spirit', 'Glass: breakage', 'Open the seal', 'Not needed', 'Local regulations']) expect(text).toContain(words);
		// The database refuses it too.
		await expect(db().query(`UPDATE treatments SET title = 'x' WHERE id = :id`, { replacements: { id: t.id }, type: QueryTypes.UPDATE })).rejects.toThrow(/cannot be changed/);
	});

	it('abandons only with a reason', async () => {
		const t = await openTreatment(author.cookie, specimen.id);
		expect((await call(`/api/treatments/${t.id}/close`, { cookie: author.cookie, json: { version: t.version, how: 'abandon', reason: '' } })).status).toBe(400);
		const res = await json(await call(`/api/treatments/${t.id}/close`, { cookie: author.cookie, json: { version: t.version, how: 'abandon', reason: 'The jar will be replaced instead.' } }));
		expect(res.body.treatment.state).toBe('abandoned');
	});
});

describe('the materials list and the treatments CSV', () => {
	it('is kept by administrators, with cure periods only for sealants', async () => {
		const name = `Test wax ${process.pid}`;
		expect((await call('/api/treatment-materials', { cookie: author.cookie, json: { kind: 'other', name } })).status).toBe(403);
		expect((await call('/api/treatment-materials', { cookie: admin.cookie, json: { kind: 'thread', name, cureHours: 3 } })).status).toBe(400);
		expect((await call('/api/treatment-materials', { cookie: admin.cookie, json: { kind: 'other', name } })).status).toBe(201);
		expect((await call('/api/treatment-materials', { cookie: admin.cookie, json: { kind: 'other', name: name.toUpperCase() } })).status).toBe(409);
	});

	it('exports the specimen’s treatments as CSV', async () => {
		const res = await call(`/api/treatments/export.csv?specimen=${specimen.id}`, { cookie: curator.cookie });
		expect(res.status).toBe(200);
		expect(res.headers.get('content-type')).toMatch(/text\/csv/);
		const parsed = Papa.parse<Record<string, string>>((await res.text()).replace(/^\uFEFF/, ''), { header: true, skipEmptyLines: true });
		expect(parsed.errors).toEqual([]);
		expect(parsed.meta.fields).toEqual([...TREATMENT_EXPORT_COLUMNS]);
		expect(parsed.data.length).toBeGreaterThanOrEqual(8);
		expect(parsed.data.every((r) => r['Object number'] === specimen.objectNumber)).toBe(true);
		const completed = parsed.data.find((r) => r.State === 'completed')!;
		expect(completed['Risk assessment']).toBe('signed-off');
		expect(completed['Signed off by']).toBe('Test reviewer');
		expect(completed['Hazards (residual)']).toBe('flammable-spirit: medium | glass: medium');
		expect(parsed.data.some((r) => r['Fluid batches (% vol)']?.includes('B-26-031 ethanol 68.35'))).toBe(true);
		expect((await call('/api/treatments/export.csv?colour=red', { cookie: curator.cookie })).status).toBe(400);
	});
});

describe('the demo treatments', () => {
	it('are valid records: one waiting for sign-off in the queue, one completed between two approved checks', async () => {
		const queue = await json(await call('/api/treatments?view=queue', { cookie: reviewer.cookie }));
		const waiting = queue.body.treatments.find((x: { specimen: { objectNumber: string } }) => x.specimen.objectNumber === 'STC.1898.014');
		expect(waiting).toBeDefined();
		const w: TreatmentView = (await json(await call(`/api/treatments/${waiting.id}`, { cookie: reviewer.cookie }))).body.treatment;
		// Every hazard the record suggests is assessed, so the reviewer can sign it off.
		expect(w.riskProblems).toEqual([]);
		expect(w.suggested.map((h) => h.kind).sort()).toEqual(w.risk.hazards.map((h) => h.kind).sort());
		expect(TreatmentBodySchema.safeParse(bodyFromView(w)).success).toBe(true);
		const [row] = await db().query<{ id: string }>(`SELECT id FROM treatments WHERE state = 'completed' AND created_by = (SELECT id FROM users WHERE email = 'conservator@example.org')`, { type: QueryTypes.SELECT });
		const c: TreatmentView = (await json(await call(`/api/treatments/${row!.id}`, { cookie: curator.cookie }))).body.treatment;
		expect(TreatmentBodySchema.safeParse(bodyFromView(c)).success).toBe(true);
		expect(c.completionProblems).toEqual([]);
		expect([c.beforeCheck?.state, c.afterCheck?.state]).toEqual(['approved', 'approved']);
		expect(c.cure.warnings).toEqual([]);
	});
});
