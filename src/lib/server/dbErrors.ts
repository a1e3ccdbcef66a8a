/**
 * Whether an error means the database cannot be reached right now (stopped, crashed, restarting,
 * connection lost), as opposed to a fault in the request or the code. Such a request gets a 503
 * with Retry-After, which says "try again shortly" (ASVS 5.0 16.5.2: degrade gracefully), instead of
 * a 500. PostgreSQL guarantees a transaction cut off this way left nothing behind.
 *
 * Sequelize wraps the driver's error (in `parent`/`original`); node-postgres reports a lost
 * connection by message only; PostgreSQL's SQLSTATE classes 08 (connection exception) and 57P
 * (operator intervention: shutdown, crash, cannot connect now) are the server's own words for it.
 */
const SEQUELIZE_CONNECTION_ERRORS = new Set([
	'SequelizeConnectionError',
	'SequelizeConnectionRefusedError',
	'SequelizeConnectionAcquireTimeoutError',
	'SequelizeConnectionTimedOutError',
	'SequelizeHostNotFoundError',
	'SequelizeHostNotReachableError',
	'SequelizeInvalidConnectionError',
]);
const SOCKET_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH']);
const LOST = /connection terminated|terminating connection|the database system is (starting up|shutting down|in recovery mode|not yet accepting connections)|client has encountered a connection error|timeout exceeded when trying to connect|connection is insecure|not queryable/i;

export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
	if (!err || typeof err !== 'object' || depth > 4) return false;
	const e = err as { name?: unknown; code?: unknown; message?: unknown; parent?: unknown; original?: unknown; cause?: unknown };
	if (typeof e.name === 'string' && SEQUELIZE_CONNECTION_ERRORS.has(e.name)) return true;
	if (typeof e.code === 'string' && (/^(08|57P0[123])/.test(e.code) || SOCKET_CODES.has(e.code))) return true;
	if (typeof e.message === 'string' && LOST.test(e.message)) return true;
	return [e.parent, e.original, e.cause].some((x) => x !== err && isDatabaseUnavailable(x, depth + 1));
}

export const UNAVAILABLE_MESSAGE = 'The database is not available at the moment; nothing was changed. Try again in a few seconds.';
