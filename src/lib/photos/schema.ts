import { z } from 'zod';
import { PHOTO_STAGES, PHOTO_VIEWS } from './vocabulary.ts';

/**
 * What an uploader may say about a file when it creates a tus upload (the Upload-Metadata header).
 * tus sends every value as a string; only these keys are read, anything else is ignored, and who
 * uploaded it is set by the server, never taken from the client.
 */
const noControl = (s: string) => !/[\u0000-\u001f\u007f]/.test(s);

export const UploadMetaSchema = z.object({
	filename: z
		.string({ message: 'The file name is missing.' })
		.trim()
		.min(1, 'The file name is missing.')
		.max(255, 'The file name is longer than 255 characters.')
		.refine(noControl, 'The file name contains control characters.'),
	filetype: z.string().max(100).optional(),
	specimenId: z.uuid({ message: 'Say which specimen the photo belongs to.' }),
	checkId: z.uuid({ message: 'The condition check id is not valid.' }).optional(),
	view: z.enum(PHOTO_VIEWS, { message: `The view must be one of: ${PHOTO_VIEWS.join(', ')}.` }),
	stage: z.enum(PHOTO_STAGES, { message: `The stage must be one of: ${PHOTO_STAGES.join(', ')}.` }),
	sha256: z
		.string()
		.regex(/^[0-9a-f]{64}$/i, 'The SHA-256 must be 64 hexadecimal digits.')
		.transform((s) => s.toLowerCase())
		.optional(),
});
export type UploadMeta = z.output<typeof UploadMetaSchema>;

/** tus metadata: keys without a value arrive as null; treat empty as absent. */
export function metaFromTus(raw: Record<string, string | null | undefined> | undefined): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of Object.entries(raw ?? {})) if (typeof v === 'string' && v !== '') out[k] = v;
	// Uppy sends `name`/`type`; tus-js-client users usually send `filename`/`filetype`.
	out.filename ??= out.name ?? '';
	if (out.type && !out.filetype) out.filetype = out.type;
	return out;
}
