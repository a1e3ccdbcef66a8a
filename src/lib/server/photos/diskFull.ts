/**
 * Running out of disk space, recognised wherever it shows: an errno from Node (ENOSPC, or EDQUOT
 * for a quota) or libvips's message (sharp's errors carry no errno). A full disk is a fault of the
 * machine, never of the photo: an upload stops with 507 and resumes later, a job fails and is
 * retried, and nothing is refused or removed because of it (TESTPLAN F7; ASVS 5.0 16.5.3).
 */
const SPACE_CODES = new Set(['ENOSPC', 'EDQUOT']);
const SPACE_MESSAGE = /no space left on device|out of disk space|disk quota exceeded|ENOSPC|EDQUOT/i;

export function isOutOfSpace(err: unknown): boolean {
	const code = (err as NodeJS.ErrnoException | null)?.code;
	if (typeof code === 'string' && SPACE_CODES.has(code)) return true;
	return SPACE_MESSAGE.test(String((err as Error | null)?.message ?? err));
}

/**
 * The tus answer to a PATCH or POST the disk could not take (507 Insufficient Storage, RFC 4918
 * §11.5): what arrived before the disk filled is kept, and tus's HEAD offers it for resuming.
 */
export const OUT_OF_SPACE = {
	status_code: 507,
	body: 'The server is out of storage space, so the upload stopped. What arrived is kept: try again later and it resumes where it stopped. Please tell the administrator.\n',
} as const;
