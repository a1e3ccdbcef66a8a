import { describe, expect, it } from 'vitest';
import { securityHeaders } from '../../src/lib/server/security.ts';

/** TESTPLAN A9 (ASVS 5.0 3.4.1 HSTS of at least a year over all subdomains at L2; RFC 6797 §8.1). */
describe('securityHeaders', () => {
	it('tells browsers to keep to https for a year, subdomains included, on a site behind https', () => {
		const hsts = securityHeaders(true)['strict-transport-security'] ?? '';
		expect(Number(/max-age=(\d+)/.exec(hsts)?.[1])).toBeGreaterThanOrEqual(31_536_000);
		expect(hsts).toMatch(/includeSubDomains/);
	});

	it('sends no HSTS over plain http, where browsers ignore it, and the same other headers either way', () => {
		expect(securityHeaders(false)['strict-transport-security']).toBeUndefined();
		const { 'strict-transport-security': _hsts, ...rest } = securityHeaders(true);
		expect(rest).toEqual(securityHeaders(false));
		expect(rest['content-security-policy']).toMatch(/object-src 'none'; base-uri 'none'/);
	});
});
