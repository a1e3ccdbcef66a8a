import { describe, expect, it } from 'vitest';
import { actionsOf, describeDetail, kindOf, SecurityQuerySchema, toJsonLines, withoutSecrets, type SecurityEvent } from '../../../src/lib/audit/security.ts';

describe('the security log rules (ASVS 5.0 16.2–16.4)', () => {
	it('puts each security action in exactly one kind, and ordinary record changes in none', () => {
		const all = actionsOf('all');
		expect(new Set(all).size).toBe(all.length);
		expect(kindOf('sign-in.throttled')).toBe('authentication');
		expect(kindOf('access.refused')).toBe('access');
		expect(kindOf('user.update')).toBe('accounts');
		expect(kindOf('specimen.update')).toBeNull();
	});

	it('drops secret-looking keys at any depth (16.2.5)', () => {
		const cleaned = withoutSecrets({ email: 'a@example.org', password: 'x', nested: [{ sessionId: 's', token: 't', ok: 1 }], apiSecret: 'k', passwordHash: 'h' });
		expect(cleaned).toEqual({ email: 'a@example.org', nested: [{ ok: 1 }] });
	});

	it('writes JSON Lines with line breaks inside values escaped (16.4.1)', () => {
		const e = { id: 1, occurredAt: '2026-12-02T10:00:00.000Z', action: 'sign-in.failed', kind: 'authentication', actor: null, entityType: 'user', entityId: null, subject: null, clientAddress: '192.0.2.1', detail: { after: { email: 'a\r\n{"forged":1}' } } } satisfies SecurityEvent;
		const text = toJsonLines([e, { ...e, id: 2 }]);
		expect(text.split('\n')).toHaveLength(3); // two lines and the final newline
		expect(JSON.parse(text.split('\n')[0]!).detail.after.email).toBe('a\r\n{"forged":1}');
		expect(toJsonLines([])).toBe('');
	});

	it('describes a change field by field, and other values by name', () => {
		expect(describeDetail({ before: { role: 'conservator', name: 'A' }, after: { role: 'reviewer', name: 'A' } })).toEqual(['role: conservator → reviewer']);
		expect(describeDetail({ after: { why: 'password', trustedDevice: false, email: 'a@example.org' } })).toEqual(['reason: password', 'known browser: no', 'address tried: a@example.org']);
		expect(describeDetail(null)).toEqual([]);
	});

	it('admits only plain filters', () => {
		expect(SecurityQuerySchema.safeParse({ address: '192.0.2.' }).success).toBe(true);
		expect(SecurityQuerySchema.safeParse({ address: '%' }).success).toBe(false);
		expect(SecurityQuerySchema.safeParse({ since: '2026-12-01' }).success).toBe(true);
		expect(SecurityQuerySchema.safeParse({ since: '2026-12-01T10:00:00+01:00' }).success).toBe(true);
		expect(SecurityQuerySchema.safeParse({ since: 'yesterday' }).success).toBe(false);
		expect(SecurityQuerySchema.safeParse({ extra: '1' }).success).toBe(false);
	});
});
