import { ACCEPTED_EXTENSIONS, ACCEPTED_MIME } from './sniff.ts';
import { MAX_FILES_PER_BATCH, MAX_UPLOAD_BYTES } from './limits.ts';
import type { PhotoStage } from './vocabulary.ts';

/**
 * The uploader's restrictions, the same numbers and types the server enforces, so a wrong file is
 * refused in the browser before a byte is sent (the server still checks the bytes themselves).
 */
export const UPLOAD_RESTRICTIONS = {
	allowedFileTypes: [...ACCEPTED_MIME, ...ACCEPTED_EXTENSIONS],
	maxFileSize: MAX_UPLOAD_BYTES,
	minFileSize: 1,
	maxNumberOfFiles: MAX_FILES_PER_BATCH,
};

/** tus metadata keys the uploader sends; the server reads these and ignores anything else. */
export const UPLOAD_META_FIELDS = ['name', 'type', 'specimenId', 'checkId', 'view', 'stage', 'sha256'];

/** A 32 MiB PATCH at a time: a dropped connection costs at most that much, and proxies with body limits pass it. */
export const UPLOAD_CHUNK_BYTES = 32 * 1024 * 1024;

/** Retry a dropped connection for about five minutes, backing off, before asking the person. */
export const UPLOAD_RETRY_DELAYS = [0, 1000, 3000, 5000, 10_000, 20_000, 30_000, 60_000, 60_000, 60_000, 60_000];

/** The stage a check's photos default to, from the reason the check was opened. */
export function stageForReason(reason: string | null | undefined): PhotoStage {
	if (reason === 'before-treatment') return 'before-treatment';
	if (reason === 'after-treatment') return 'after-treatment';
	return 'as-found';
}

/** The tus upload id at the end of an upload URL, or null. */
export function uploadIdFromUrl(url: string | undefined | null): string | null {
	const m = /\/api\/uploads\/([0-9a-f]{16,64})(?:[?#].*)?$/.exec(url ?? '');
	return m?.[1] ?? null;
}
