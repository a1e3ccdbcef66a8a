import { hash, verify } from '@node-rs/argon2';

/**
 * Password hashing: Argon2id with the OWASP Password Storage Cheat Sheet's first parameter set
 * (m = 19456 KiB, t = 2, p = 1), which ASVS 5.0 11.4.2 accepts; about 60 ms here (STACK.md).
 * The whole password is hashed (no truncation, ASVS 6.2.8). `algorithm: 2` is Argon2id; the
 * package's `Algorithm` is a const enum, which isolated modules cannot import.
 */
export const ARGON2_OPTIONS = { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password.normalize('NFC'), ARGON2_OPTIONS);
}

export async function verifyPassword(storedHash: string, password: string): Promise<boolean> {
	try {
		return await verify(storedHash, password.normalize('NFC'));
	} catch {
		// A malformed stored hash is a refusal, never a crash or a pass.
		return false;
	}
}

let dummy: Promise<string> | undefined;

/**
 * Spends the same time as a real verification, for accounts that do not exist or have no password,
 * so the answer's timing does not reveal which e-mail addresses are registered (ASVS 6.3.8).
 */
export async function verifyAgainstNothing(password: string): Promise<false> {
	dummy ??= hash('meniscus timing equaliser', ARGON2_OPTIONS);
	await verifyPassword(await dummy, password);
	return false;
}
