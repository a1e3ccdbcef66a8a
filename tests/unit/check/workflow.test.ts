import { describe, expect, it } from 'vitest';
import { decideTransition, type CheckAction } from '../../../src/lib/check/workflow.ts';
import { CHECK_STATES, type CheckState } from '../../../src/lib/check/vocabulary.ts';

const author = { id: 'a', role: 'conservator' } as const;
const otherConservator = { id: 'b', role: 'conservator' } as const;
const reviewer = { id: 'r', role: 'reviewer' } as const;
const curator = { id: 'c', role: 'curator' } as const;
const check = (state: CheckState) => ({ state, examinerId: 'a' });

describe('the check workflow', () => {
	it('goes draft → in review → approved', () => {
		expect(decideTransition(check('draft'), 'submit', author)).toEqual({ ok: true, next: 'in-review' });
		expect(decideTransition(check('in-review'), 'approve', reviewer)).toEqual({ ok: true, next: 'approved' });
	});
	it('goes in review → returned → (edited) draft → in review again', () => {
		expect(decideTransition(check('in-review'), 'return', reviewer)).toEqual({ ok: true, next: 'returned' });
		expect(decideTransition(check('returned'), 'edit', author)).toEqual({ ok: true, next: 'draft' });
		expect(decideTransition(check('returned'), 'submit', author)).toEqual({ ok: true, next: 'in-review' });
	});
	it('never changes an approved check, and nothing is edited while in review', () => {
		for (const a of ['edit', 'submit', 'approve', 'return'] as CheckAction[]) {
			expect(decideTransition(check('approved'), a, a === 'edit' || a === 'submit' ? author : reviewer).ok).toBe(false);
		}
		expect(decideTransition(check('in-review'), 'edit', author)).toMatchObject({ ok: false, reason: expect.stringMatching(/waiting for review/) });
	});
	it('lets nobody review their own check, and only reviewers review', () => {
		expect(decideTransition({ state: 'in-review', examinerId: 'r' }, 'approve', reviewer)).toMatchObject({ ok: false, reason: expect.stringMatching(/own check/) });
		expect(decideTransition(check('in-review'), 'approve', otherConservator).ok).toBe(false);
		expect(decideTransition(check('in-review'), 'approve', curator).ok).toBe(false);
	});
	it('lets only conservators write checks', () => {
		expect(decideTransition(check('draft'), 'edit', reviewer).ok).toBe(false);
		expect(decideTransition(check('draft'), 'edit', curator).ok).toBe(false);
	});
	it('refuses every pair the table does not allow (exhaustive over states × actions × roles)', () => {
		const allowed = new Set(['draft:edit:conservator', 'draft:submit:conservator', 'returned:edit:conservator', 'returned:submit:conservator', 'in-review:approve:reviewer', 'in-review:return:reviewer']);
		for (const s of CHECK_STATES)
			for (const a of ['edit', 'submit', 'approve', 'return'] as CheckAction[])
				for (const actor of [otherConservator, reviewer, curator, { id: 'x', role: 'admin' } as const]) {
					expect(decideTransition(check(s), a, actor).ok, `${s} ${a} ${actor.role}`).toBe(allowed.has(`${s}:${a}:${actor.role}`));
				}
	});
});
