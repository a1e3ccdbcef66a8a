import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable } from '../../src/lib/server/dbErrors.ts';

/**
 * Which errors mean "the database cannot be reached now". SQLSTATE codes from the PostgreSQL
 * documentation, appendix A (class 08 connection exception; 57P01 admin_shutdown, 57P02
 * crash_shutdown, 57P03 cannot_connect_now); error names from Sequelize 6's errors/connection.
 */
describe('isDatabaseUnavailable', () => {
	it('recognises a lost or refused connection however it is wrapped', () => {
		expect(isDatabaseUnavailable({ name: 'SequelizeConnectionRefusedError' })).toBe(true);
		expect(isDatabaseUnavailable({ name: 'SequelizeDatabaseError', parent: { code: '57P01', message: 'terminating connection due to administrator command' } })).toBe(true);
		expect(isDatabaseUnavailable({ name: 'SequelizeDatabaseError', original: { code: '57P03' } })).toBe(true);
		expect(isDatabaseUnavailable({ code: '08006' })).toBe(true);
		expect(isDatabaseUnavailable(new Error('Connection terminated unexpectedly'))).toBe(true);
		expect(isDatabaseUnavailable(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' }))).toBe(true);
		expect(isDatabaseUnavailable(new Error('outer', { cause: { code: 'ECONNRESET' } }))).toBe(true);
	});
	it('leaves every other error alone', () => {
		expect(isDatabaseUnavailable(new Error('boom'))).toBe(false);
		// 23505 unique_violation and 40001 serialization_failure are the request's business, not an outage.
		expect(isDatabaseUnavailable({ name: 'SequelizeUniqueConstraintError', parent: { code: '23505' } })).toBe(false);
		expect(isDatabaseUnavailable({ name: 'SequelizeDatabaseError', parent: { code: '40001' } })).toBe(false);
		expect(isDatabaseUnavailable(null)).toBe(false);
		const loop: { parent?: unknown } = {};
		loop.parent = loop;
		expect(isDatabaseUnavailable(loop)).toBe(false);
	});
});
