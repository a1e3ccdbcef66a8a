import { Server } from '@tus/server';
import type { SignedInUser } from '../auth/lucia.ts';
import { config } from '../config.ts';
import { MAX_UPLOAD_BYTES } from '../../photos/limits.ts';
import { dirs, ensureDirs, SAFE_ID } from './storage.ts';
import { assertMayContinue, createUploadRecord, finishUpload, uploadOf, UploadRefused } from './uploads.ts';
import { removeIncoming } from './incoming.ts';
import { enqueueIngest } from './queue.ts';
import { tusPrecondition } from './tusPreconditions.ts';
import { PgLocker } from './pgLocker.ts';
import { isDatabaseUnavailable, UNAVAILABLE_MESSAGE } from '../dbErrors.ts';
import { IncomingStore } from './incomingStore.ts';
import { drainable } from './drainable.ts';
import { isOutOfSpace, OUT_OF_SPACE } from './diskFull.ts';

/**
 * The tus 1.0 server behind /api/uploads (the one catch-all endpoint). The endpoint has already
 * signed the user in and checked their role; here every request is tied to the upload's owner,
 * creation validates the metadata and the target record, a finished upload is queued for the
 * worker and cannot be deleted, and ids are only ever lowercase hex (no `../`, no `%2F`).
 * Upload locks are held in PostgreSQL (pgLocker.ts), so several app processes may serve one site.
 */
export const UPLOADS_PATH = '/api/uploads';

const who = new WeakMap<Request, SignedInUser>();

const tusError = (status: number, body: string) => ({ status_code: status, body: `${body}\n` });

function userOf(req: Request): SignedInUser {
	const u = who.get(req);
	if (!u) throw tusError(401, 'Sign in first.');
	return u;
}

async function guard<T>(run: () => Promise<T>): Promise<T> {
	try {
		return await run();
	} catch (err) {
		if (err instanceof UploadRefused) throw tusError(err.status, err.message);
		throw err;
	}
}

let server: Server | undefined;

function tusServer(): Server {
	if (server) return server;
	ensureDirs();
	const origin = new URL(config().MENISCUS_PUBLIC_URL).origin;
	server = new Server({
		path: UPLOADS_PATH,
		relativeLocation: true,
		datastore: new IncomingStore({ directory: dirs.incoming() }),
		// Not the default MemoryLocker: its locks are per process, and a second app process on the same
		// uploads folder could write the same upload at once (tus-node-server #408, TESTPLAN F4).
		locker: new PgLocker({ connectionString: config().DATABASE_URL }),
		maxSize: MAX_UPLOAD_BYTES,
		allowedOrigins: [origin],
		disableTerminationForFinishedUploads: true,
		getFileIdFromRequest: (_req, id) => (id !== undefined && SAFE_ID.test(id) ? id : undefined),
		onIncomingRequest: async (req, id) => {
			const user = userOf(req);
			// Creation is checked in onUploadCreate; every other request must be the owner's.
			if (req.method === 'POST') return;
			const upload = await guard(() => uploadOf(user, id));
			// More bytes only while the photo's check still takes photographs.
			if (req.method === 'PATCH' || req.method === 'HEAD') await guard(() => assertMayContinue(upload));
		},
		onUploadCreate: async (req, upload) => {
			const user = userOf(req);
			await guard(() => createUploadRecord(user, upload.id, upload.metadata, upload.size));
			// What the worker reads back from incoming/<id>.json; the uploader is the server's word.
			return { metadata: { ...upload.metadata, uploaderId: user.id } };
		},
		onUploadFinish: async (_req, upload) => {
			const finished = await finishUpload(upload.id);
			if (!finished.ok) {
				// The check was submitted or approved while the bytes were on their way (a PATCH is
				// checked when it starts, and a large one takes minutes). A refused file is not kept.
				await removeIncoming(upload.id).catch(() => {});
				throw tusError(403, finished.reason);
			}
			// Marked finished by the reconciler meanwhile: it has queued the job.
			if (!finished.first) return {};
			// If the queue is unreachable the bytes are safe on disk and the reconciler queues them.
			await enqueueIngest(upload.id).catch((err) => console.error(`[uploads] could not queue ${upload.id}: ${err.message}`));
			return {};
		},
		onResponseError: (_req, err) => {
			if ('status_code' in err && err.status_code < 500) return undefined;
			// Like every other route (middleware.ts): the database is away, the client may try again;
			// the upload's bytes so far are on disk and its next HEAD finds them.
			if (isDatabaseUnavailable(err)) return { status_code: 503, body: `${UNAVAILABLE_MESSAGE}\n` };
			// A full disk (TESTPLAN F7): the client is told, and keeps what it sent (HEAD, then resume).
			if (err === OUT_OF_SPACE || isOutOfSpace(err)) {
				console.error('[uploads] out of disk space in the uploads folder');
				return OUT_OF_SPACE;
			}
			console.error(`[uploads] ${'message' in err ? err.message : err.body}`);
			return { status_code: 500, body: 'The upload could not be stored; try again.\n' };
		},
	});
	return server;
}

export async function handleTus(request: Request, user: SignedInUser): Promise<Response> {
	const refused = tusPrecondition(request, UPLOADS_PATH);
	if (refused) return refused;
	const patch = request.method === 'PATCH' && request.body ? drainable(request) : null;
	const req = patch?.request ?? request;
	who.set(req, user);
	const response = await tusServer().handleWeb(req);
	// The client is still sending the rest of a PATCH the disk could not take: read it to the end
	// (and discard it) so that the 507 reaches the client instead of a reset connection.
	if (patch && response.status === OUT_OF_SPACE.status_code) void patch.drain().catch(() => {});
	// tus's error hook sets only the status and body; a 503 says when to come back, as the middleware's does.
	if (response.status === 503) response.headers.set('retry-after', '5');
	return response;
}
