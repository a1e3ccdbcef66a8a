import { describe, expect, it } from 'vitest';
import { assessmentChanged, completionProblems, decideTreatment, riskProblems, stepGateProblems, type AssessedHazard } from '../../../src/lib/treatment/workflow.ts';
import { cureStatus, type CureStep } from '../../../src/lib/treatment/cure.ts';

const author = { id: 'a', role: 'conservator' as const };
const other = { id: 'b', role: 'conservator' as const };
const reviewer = { id: 'r', role: 'reviewer' as const };
const facts = (riskState: 'draft' | 'in-review' | 'signed-off' | 'returned', state: 'planning' | 'in-progress' | 'completed' | 'abandoned' = 'planning') => ({ riskState, state, authorId: 'a' });

describe('who may do what to a treatment', () => {
	it('lets conservators edit and submit, reviewers sign off, nobody their own', () => {
		expect(decideTreatment(facts('draft'), 'edit', other).ok).toBe(true);
		expect(decideTreatment(facts('draft'), 'edit', reviewer).ok).toBe(false);
		expect(decideTreatment(facts('draft'), 'submit-risk', author).ok).toBe(true);
		expect(decideTreatment(facts('in-review'), 'submit-risk', author).ok).toBe(false);
		expect(decideTreatment(facts('in-review'), 'sign-off', reviewer).ok).toBe(true);
		expect(decideTreatment(facts('draft'), 'sign-off', reviewer).ok).toBe(false);
		expect(decideTreatment(facts('in-review'), 'sign-off', author).ok).toBe(false);
		expect(decideTreatment(facts('in-review'), 'sign-off', { id: 'a', role: 'reviewer' })).toEqual({ ok: false, reason: 'Nobody may sign off their own risk assessment.' });
		expect(decideTreatment(facts('signed-off', 'completed'), 'edit', author).ok).toBe(false);
		expect(decideTreatment(facts('in-review', 'abandoned'), 'sign-off', reviewer).ok).toBe(false);
	});
});

const step = (id: string, kind: CureStep['kind'], status: CureStep['status'] = 'planned') => ({ id, kind, title: id, status });

describe('the sign-off gate on work steps', () => {
	const before = [step('p', 'photograph-before'), step('o', 'open-seal')];
	it('refuses to start a work step before sign-off', () => {
		expect(stepGateProblems(before, [step('p', 'photograph-before', 'done'), step('o', 'open-seal')], 'draft')).toEqual([]);
		expect(stepGateProblems(before, [step('p', 'photograph-before'), step('o', 'open-seal', 'started')], 'in-review')).toHaveLength(1);
		expect(stepGateProblems(before, [step('p', 'photograph-before'), step('o', 'open-seal', 'done')], 'returned')).toHaveLength(1);
		// A new step added already started is gated too.
		expect(stepGateProblems(before, [...before, step('n', 'custom', 'started')], 'draft')).toHaveLength(1);
	});
	it('allows it after sign-off, and lets a started step finish after the sign-off is voided', () => {
		expect(stepGateProblems(before, [step('p', 'photograph-before'), step('o', 'open-seal', 'started')], 'signed-off')).toEqual([]);
		expect(stepGateProblems([step('o', 'open-seal', 'started')], [step('o', 'open-seal', 'done')], 'draft')).toEqual([]);
	});
});

const hazard = (over: Partial<AssessedHazard> = {}): AssessedHazard => ({ kind: 'glass', inherent: { likelihood: 3, severity: 3 }, residual: { likelihood: 2, severity: 3 }, controls: ['gloves-cut'], otherControls: '', ...over });

describe('when a risk assessment is ready for sign-off', () => {
	it('is ready when every suggestion is assessed or dismissed with controls and a lower residual', () => {
		expect(riskProblems({ hazards: [hazard()], dismissed: [{ kind: 'formaldehyde' }] }, ['glass', 'formaldehyde'])).toEqual([]);
	});
	it('names what is missing', () => {
		expect(riskProblems({ hazards: [], dismissed: [] }, [])).toEqual(['Assess at least one hazard.']);
		expect(riskProblems({ hazards: [hazard()], dismissed: [] }, ['glass', 'formaldehyde'])[0]).toMatch(/Formaldehyde/);
		expect(riskProblems({ hazards: [hazard({ controls: [] })], dismissed: [] }, [])[0]).toMatch(/control/);
		expect(riskProblems({ hazards: [hazard({ residual: { likelihood: 4, severity: 3 } })], dismissed: [] }, [])[0]).toMatch(/worse/);
		expect(riskProblems({ hazards: [hazard({ inherent: { likelihood: 5, severity: 5 }, residual: { likelihood: 4, severity: 5 } })], dismissed: [] }, [])[0]).toMatch(/very high/);
	});
	it('sees a change to the assessment but not to key order', () => {
		expect(assessmentChanged({ a: 1, b: [1, 2] }, { b: [1, 2], a: 1 })).toBe(false);
		expect(assessmentChanged({ a: 1, b: [1, 2] }, { a: 1, b: [2, 1] })).toBe(true);
	});
	it('completes only with every step finished or not needed and an after check', () => {
		expect(completionProblems({ steps: [step('a', 'seal', 'done'), step('b', 'cure', 'skipped')], afterCheckId: 'x' })).toEqual([]);
		expect(completionProblems({ steps: [step('a', 'seal', 'started')], afterCheckId: null })).toHaveLength(2);
	});
});

const cs = (id: string, kind: CureStep['kind'], status: CureStep['status'], extra: Partial<CureStep> = {}): CureStep => ({ id, kind, title: id, status, startedAt: null, finishedAt: null, materials: [], ...extra });

describe('cure timers', () => {
	const applied = '2026-12-01T15:00:00.000Z';
	// Silicone: at least overnight before disturbing (common practice, no published source; TRADE.md [S15]); 24 h here.
	const sealStep = cs('s', 'seal', 'done', { materials: [{ kind: 'sealant', name: 'Neutral-cure silicone', appliedAt: applied, cureHours: 24 }] });
	it('shows when the jar may be disturbed and warns the next disturbing steps until then', () => {
		const st = cureStatus([sealStep, cs('c', 'cure', 'planned'), cs('f', 'finish-seal', 'planned'), cs('r', 'record', 'planned')], new Date('2026-12-02T09:00:00Z'));
		expect(st.mayDisturbAt).toBe('2026-12-02T15:00:00.000Z');
		expect(st.warnings.map((w) => [w.stepId, w.kind])).toEqual([['f', 'wait']]);
		expect(st.warnings[0]!.message).toContain('2026-12-02 15:00 UTC');
	});
	it('stops warning once the cure time has passed', () => {
		const st = cureStatus([sealStep, cs('f', 'finish-seal', 'planned')], new Date('2026-12-02T15:00:01Z'));
		expect(st.warnings).toEqual([]);
	});
	it('records a step started before the sealant cured, and a cure marked done too soon', () => {
		const st = cureStatus([sealStep, cs('c', 'cure', 'done', { finishedAt: '2026-12-01T20:00:00.000Z' }), cs('f', 'finish-seal', 'done', { startedAt: '2026-12-02T08:00:00.000Z' })], new Date('2026-12-03T00:00:00Z'));
		expect(st.warnings.map((w) => [w.stepId, w.kind])).toEqual([['c', 'early'], ['f', 'early']]);
		// Marked done with only a finish time: it began by then at the latest.
		const done = cureStatus([sealStep, cs('p', 'photograph-after', 'done', { finishedAt: '2026-12-01T18:00:00.000Z' })], new Date('2026-12-03T00:00:00Z'));
		expect(done.warnings).toEqual([{ stepId: 'p', kind: 'early', message: expect.stringMatching(/^Done at 2026-12-01 18:00 UTC, before/) }]);
	});
	it('asks for the sealant when a sealing step is done without one, and ignores steps before the seal', () => {
		const st = cureStatus([cs('o', 'open-seal', 'planned'), cs('s', 'seal', 'done')], new Date());
		expect(st.warnings).toEqual([{ stepId: 's', kind: 'no-timer', message: expect.stringContaining('Record the sealant') }]);
		expect(st.mayDisturbAt).toBeNull();
	});
});
