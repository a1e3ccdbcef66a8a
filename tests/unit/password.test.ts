import { describe, expect, it } from 'vitest';
import { hashPassword, verifyAgainstNothing, verifyPassword } from '../../src/lib/server/auth/password.ts';

/**
 * Reference vector: the Argon2 reference implementation (P-H-C/phc-winner-argon2, the `argon2`
 * command-line tool): `echo -n password | argon2 somesalt -id -t 2 -m 16 -p 4 -l 32 -e` prints
 * this PHC string; argon2-cffi lists the same one among its known-correct hashes.
 */
const REFERENCE = '$argon2id$v=19$m=65536,t=2,p=4$c29tZXNhbHQ$GpZ3sK/oH9p7VIiV56G/64Zo/8GaUw434IimaPqxwCo';

describe('password hashing', () => {
	it('verifies the Argon2 reference implementation’s own hash of "password"', async () => {
		expect(await verifyPassword(REFERENCE, 'password')).toBe(true);
		expect(await verifyPassword(REFERENCE, 'Password')).toBe(false);
		expect(await verifyPassword(REFERENCE, 'password ')).toBe(false);
	});

	it('hashes with Argon2id at m=19456 KiB, t=2, p=1 (OWASP Password Storage Cheat Sheet)', async () => {
		const h = await hashPassword('a long enough passphrase');
		expect(h).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$[A-Za-z0-9+/]{22}\$[A-Za-z0-9+/]{43}$/);
	});

	it('salts every hash, so one password gives different hashes that both verify', async () => {
		const [a, b] = await Promise.all([hashPassword('same words twice'), hashPassword('same words twice')]);
		expect(a).not.toBe(b);
		expect(await verifyPassword(a, 'same words twice')).toBe(true);
		expect(await verifyPassword(b, 'same words twice')).toBe(true);
	});

	it('does not truncate: a 256-character password differing only in its last character fails', async () => {
		const long = 'x'.repeat(255);
		const h = await hashPassword(`${long}a`);
		expect(await verifyPassword(h, `${long}a`)).toBe(true);
		expect(await verifyPassword(h, `${long}b`)).toBe(false);
	});

	it('treats the composed and decomposed forms of an accented letter as the same password (NFC)', async () => {
		const h = await hashPassword('crème brûlée jar'.normalize('NFC'));
		expect(await verifyPassword(h, 'crème brûlée jar'.normalize('NFD'))).toBe(true);
	});

	it('answers false, never throws, for a malformed stored hash', async () => {
		expect(await verifyPassword('not-a-hash', 'anything')).toBe(false);
		expect(await verifyPassword('', 'anything')).toBe(false);
	});

	it('spends a verification even when there is no account, and never succeeds', async () => {
		expect(await verifyAgainstNothing('meniscus timing equaliser')).toBe(false);
	});
});
