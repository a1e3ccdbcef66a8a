import Uppy, { type Meta } from '@uppy/core';
import Tus from '@uppy/tus';
import GoldenRetriever from '@uppy/golden-retriever';
import type { PhotoStage, PhotoView } from '../../lib/photos/vocabulary.ts';
import { UPLOAD_CHUNK_BYTES, UPLOAD_META_FIELDS, UPLOAD_RESTRICTIONS, UPLOAD_RETRY_DELAYS, uploadIdFromUrl } from '../../lib/photos/uploadPolicy.ts';

/**
 * One Uppy for photographs, as both uploaders use it: tus to /api/uploads in 32 MiB requests with
 * retries, the server's restrictions, Golden Retriever so a closed tab resumes, and each file's
 * SHA-256 computed before it is sent so the server can prove the bytes arrived unchanged.
 */
export interface PhotoMeta extends Meta {
	specimenId: string;
	checkId?: string;
	view: PhotoView;
	stage: PhotoStage;
	sha256?: string;
}

export type PhotoUppy = Uppy<PhotoMeta, Record<string, never>>;

async function sha256Hex(blob: Blob): Promise<string> {
	const digest = await crypto.subtle.digest('SHA-256', await blob.arrayBuffer());
	return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

export function createPhotoUppy(id: string, meta: Partial<PhotoMeta>): PhotoUppy {
	// Every sent field needs a value: Uppy passes a missing one to tus as the string "undefined",
	// which the server rightly refuses; empty strings are read as absent.
	const u: PhotoUppy = new Uppy<PhotoMeta, Record<string, never>>({ id, restrictions: UPLOAD_RESTRICTIONS, meta: { checkId: '', sha256: '', ...meta } as PhotoMeta })
		.use(Tus, { endpoint: '/api/uploads/', chunkSize: UPLOAD_CHUNK_BYTES, retryDelays: UPLOAD_RETRY_DELAYS, allowedMetaFields: UPLOAD_META_FIELDS, removeFingerprintOnSuccess: true, limit: 3 })
		.use(GoldenRetriever, { expires: 7 * 24 * 3600 * 1000 });
	u.addPreProcessor(async (fileIDs) => {
		for (const fid of fileIDs) {
			const file = u.getFile(fid);
			if (!file || file.meta.sha256 || !(file.data instanceof Blob)) continue;
			u.emit('preprocess-progress', file, { mode: 'indeterminate', message: 'Computing the SHA-256…' });
			u.setFileMeta(fid, { sha256: await sha256Hex(file.data) } as Partial<PhotoMeta> as PhotoMeta);
			u.emit('preprocess-complete', file);
		}
	});
	return u;
}

/** Calls `follow(uploadId, fileName)` for each file whose last byte the server has acknowledged. */
export function onUploaded(u: PhotoUppy, follow: (id: string, fileName: string) => void): () => void {
	const handler: Parameters<PhotoUppy['on']>[1] = ((file: { name?: string } | undefined, response: { uploadURL?: string }) => {
		const id = uploadIdFromUrl(response.uploadURL);
		if (file && id) follow(id, file.name ?? 'photo');
	}) as never;
	u.on('upload-success', handler as never);
	return () => void u.off('upload-success', handler as never);
}
