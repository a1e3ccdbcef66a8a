import { useEffect, useState } from 'react';
import Uppy, { type Meta } from '@uppy/core';
import Tus from '@uppy/tus';
import GoldenRetriever from '@uppy/golden-retriever';
import Dashboard from '@uppy/react/dashboard';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import { PHOTO_LABELS, PHOTO_STAGES, PHOTO_VIEWS, type PhotoStage, type PhotoView } from '../../lib/photos/vocabulary.ts';
import { ACCEPTED_TYPES_TEXT, MAX_UPLOAD_BYTES, formatBytes } from '../../lib/photos/limits.ts';
import { UPLOAD_CHUNK_BYTES, UPLOAD_META_FIELDS, UPLOAD_RESTRICTIONS, UPLOAD_RETRY_DELAYS, uploadIdFromUrl } from '../../lib/photos/uploadPolicy.ts';
import { useUploadVerdicts, type Verdict } from './useUploadVerdicts.ts';

/**
 * The uploader (Uppy's Dashboard over tus): drop many files, see each one's progress and the
 * total, pause and resume; a dropped connection is retried, and a closed tab or a restarted server
 * picks up where it stopped (Golden Retriever keeps the list in the browser and tus resumes from
 * the offset the server holds). Before sending, each file's SHA-256 is computed here so the server
 * can prove the bytes arrived unchanged. After the last byte the server checks the file; its
 * verdict (recorded, or refused and why) is shown beside the file name.
 */
interface PhotoMeta extends Meta {
	specimenId: string;
	checkId?: string;
	view: PhotoView;
	stage: PhotoStage;
	sha256?: string;
}

export interface UploaderProps {
	/** Distinguishes the restore state of different records' uploaders. */
	target: string;
	specimenId: string;
	checkId?: string;
	defaultStage: PhotoStage;
	onRecorded: (v: Verdict) => void;
}

async function sha256Hex(blob: Blob): Promise<string> {
	const digest = await crypto.subtle.digest('SHA-256', await blob.arrayBuffer());
	return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

function selectField(id: 'view' | 'stage', name: string, options: readonly string[], labels: Record<string, string>) {
	return {
		id,
		name,
		// Uppy renders meta fields with Preact; `h` is its createElement.
		render: ({ value, onChange, form }: { value: string; onChange: (v: string) => void; form: string }, h: (...a: unknown[]) => unknown) =>
			h('select', { form, value, class: 'uppy-u-reset uppy-c-textInput uppy-Dashboard-FileCard-input', onChange: (e: Event) => onChange((e.target as HTMLSelectElement).value) }, options.map((o) => h('option', { value: o, key: o }, labels[o]))),
	};
}

export function Uploader({ target, specimenId, checkId, defaultStage, onRecorded }: UploaderProps) {
	const [view, setView] = useState<PhotoView>('front');
	const [stage, setStage] = useState<PhotoStage>(defaultStage);
	const { verdicts, follow } = useUploadVerdicts(onRecorded);
	const [uppy] = useState(() => {
		const u = new Uppy<PhotoMeta, Record<string, never>>({
			id: `meniscus-photos-${target}`,
			restrictions: UPLOAD_RESTRICTIONS,
			meta: { specimenId, ...(checkId ? { checkId } : {}), view: 'front', stage: defaultStage },
		})
			.use(Tus, {
				endpoint: '/api/uploads/',
				chunkSize: UPLOAD_CHUNK_BYTES,
				retryDelays: UPLOAD_RETRY_DELAYS,
				allowedMetaFields: UPLOAD_META_FIELDS,
				removeFingerprintOnSuccess: true,
				limit: 3,
			})
			.use(GoldenRetriever, { expires: 7 * 24 * 3600 * 1000 });
		u.addPreProcessor(async (fileIDs) => {
			for (const id of fileIDs) {
				const file = u.getFile(id);
				if (!file || file.meta.sha256 || !(file.data instanceof Blob)) continue;
				u.emit('preprocess-progress', file, { mode: 'indeterminate', message: 'Computing the SHA-256…' });
				u.setFileMeta(id, { sha256: await sha256Hex(file.data) } as Partial<PhotoMeta> as PhotoMeta);
				u.emit('preprocess-complete', file);
			}
		});
		return u;
	});

	// New files take the view and stage chosen above the drop area.
	useEffect(() => {
		uppy.setMeta({ view, stage });
	}, [uppy, view, stage]);

	useEffect(() => {
		const onSuccess: Parameters<typeof uppy.on<'upload-success'>>[1] = (file, response) => {
			const id = uploadIdFromUrl(response.uploadURL);
			if (file && id) follow(id, file.name ?? 'photo');
		};
		uppy.on('upload-success', onSuccess);
		return () => {
			uppy.off('upload-success', onSuccess);
		};
	}, [uppy, follow]);

	useEffect(() => () => uppy.destroy(), [uppy]);

	const shown = verdicts.filter((v) => v.state !== 'recorded' || v.photoId);
	return (
		<div className="space-y-3">
			<div className="flex flex-wrap items-end gap-4">
				<label className="text-sm">
					<span className="field-label">View of these photos</span>
					<select className="field-input" value={view} onChange={(e) => setView(e.target.value as PhotoView)}>
						{PHOTO_VIEWS.map((v) => (
							<option key={v} value={v}>
								{PHOTO_LABELS.view[v]}
							</option>
						))}
					</select>
				</label>
				<label className="text-sm">
					<span className="field-label">Stage</span>
					<select className="field-input" value={stage} onChange={(e) => setStage(e.target.value as PhotoStage)}>
						{PHOTO_STAGES.map((s) => (
							<option key={s} value={s}>
								{PHOTO_LABELS.stage[s]}
							</option>
						))}
					</select>
				</label>
				<p className="text-xs text-ink-500">Each file's view and stage can be changed before upload with its edit button.</p>
			</div>
			<Dashboard
				uppy={uppy}
				width="100%"
				height={360}
				proudlyDisplayPoweredByUppy={false}
				hideProgressDetails={false}
				note={`${ACCEPTED_TYPES_TEXT}, up to ${formatBytes(MAX_UPLOAD_BYTES)} each. Originals are kept exactly as sent.`}
				metaFields={[selectField('view', 'View', PHOTO_VIEWS, PHOTO_LABELS.view), selectField('stage', 'Stage', PHOTO_STAGES, PHOTO_LABELS.stage)] as never}
			/>
			{shown.length > 0 && (
				<ul className="space-y-1 text-sm" aria-label="What the server made of each upload" aria-live="polite">
					{shown.map((v) => (
						<li key={v.id} className={v.state === 'refused' || v.state === 'quarantined' ? 'notice-error' : v.state === 'recorded' ? 'notice-info' : 'notice notice-info'}>
							<span className="font-semibold">{v.fileName}</span>: {v.label}
							{v.reason ? ` — ${v.reason}` : ''}
						</li>
					))}
				</ul>
			)}
		</div>
	);
}
