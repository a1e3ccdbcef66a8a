import { createHash, randomBytes } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { AuthToken, type TokenPurpose } from '../models/index.ts';

/**
 * Single-use, expiring tokens for invitations and password resets. The token (256 random bits) goes
 * only into the e-mail; the database keeps its SHA-256, so the table alone cannot open an account.
 * Issuing a new token of a purpose cancels the user's earlier unused ones.
 */
export const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

export async function issueToken(
	userId: string,
	purpose: TokenPurpose,
	ttlMs: number,
	transaction?: Transaction,
	now = new Date(),
): Promise<string> {
	const token = randomBytes(32).toString('base64url');
	await AuthToken.update(
		{ usedAt: now },
		{ where: { userId, purpose, usedAt: null }, transaction },
	);
	await AuthToken.create(
		{ userId, purpose, tokenHash: sha256(token), expiresAt: new Date(now.getTime() + ttlMs), usedAt: null },
		{ transaction },
	);
	return token;
}

/** A token that is valid at `now` (unused, unexpired), without using it; for showing the form. */
export async function findValidToken(token: string, now = new Date()): Promise<AuthToken | null> {
	if (!/^[A-Za-z0-9_-]{43}$/.test(token)) return null;
	return AuthToken.findOne({
		where: { tokenHash: sha256(token), usedAt: null, expiresAt: { [Op.gt]: now } },
	});
}

/**
 * Uses a token: marks it used in the same statement that checks it, so two concurrent requests
 * with one token cannot both succeed. Returns the token's user and purpose, or null.
 */
export async function consumeToken(
	token: string,
	transaction: Transaction,
	now = new Date(),
): Promise<{ userId: string; purpose: TokenPurpose } | null> {
	if (!/^[A-Za-z0-9_-]{43}$/.test(token)) return null;
	const [count, rows] = await AuthToken.update(
		{ usedAt: now },
		{
			where: { tokenHash: sha256(token), usedAt: null, expiresAt: { [Op.gt]: now } },
			returning: true,
			transaction,
		},
	);
	const row = rows[0];
	return count === 1 && row ? { userId: row.userId, purpose: row.purpose } : null;
}
