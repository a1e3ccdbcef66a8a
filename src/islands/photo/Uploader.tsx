import { useEffect, useState } from 'react';
import Dashboard from '@uppy/react/dashboard';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import { PHOTO_LABELS, PHOTO_STAGES, PHOTO_VIEWS, type PhotoStage, type PhotoView } from '../../lib/photos/vocabulary.ts';
import { ACCEPTED_TYPES_TEXT, MAX_UPLOAD_BYTES, formatBytes } from '../../lib/photos/limits.ts';
import { useUploadVerdicts, type Verdict } from './useUploadVerdicts.ts';
import { createPhotoUppy, onUploaded, type PhotoUppy } from './photoUppy.ts';
import { VerdictList } from './VerdictList.tsx';

/**
 * The uploader of one record (Uppy's Dashboard over tus): drop many files, see each one's progress
 * and the total, pause and resume; a dropped connection is retried, and a closed tab or a
 * restarted server picks up where it stopped. After the last byte the server checks each file;
 * its verdict (recorded, or refused and why) is shown below.
 */
export interface UploaderProps {
	/** Distinguishes the restore state of different records' uploaders. */
	target: string;
	specimenId: string;
	checkId?: string;
	defaultStage: PhotoStage;
	onRecorded: (v: Verdict) => void;
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

/** The Dashboard as both uploaders show it. */
export function PhotoDashboard({ uppy, height = 360 }: { uppy: PhotoUppy; height?: number }) {
	return (
		<Dashboard
			uppy={uppy}
			width="100%"
			height={height}
			proudlyDisplayPoweredByUppy={false}
			hideProgressDetails={false}
			note={`${ACCEPTED_TYPES_TEXT}, up to ${formatBytes(MAX_UPLOAD_BYTES)} each. Originals are kept exactly as sent.`}
			metaFields={[selectField('view', 'View', PHOTO_VIEWS, PHOTO_LABELS.view), selectField('stage', 'Stage', PHOTO_STAGES, PHOTO_LABELS.stage)] as never}
		/>
	);
}

/** Choosers for the view and stage new files take. */
export function ViewStagePicker({ view, stage, onView, onStage }: { view: PhotoView; stage: PhotoStage; onView: (v: PhotoView) => void; onStage: (s: PhotoStage) => void }) {
	return (
		<div className="flex flex-wrap items-end gap-4">
			<label className="text-sm">
				<span className="field-label">View of these photos</span>
				<select className="field-input" value={view} onChange={(e) => onView(e.target.value as PhotoView)}>
					{PHOTO_VIEWS.map((v) => (
						<option key={v} value={v}>
							{PHOTO_LABELS.view[v]}
						</option>
					))}
				</select>
			</label>
			<label className="text-sm">
				<span className="field-label">Stage</span>
				<select className="field-input" value={stage} onChange={(e) => onStage(e.target.value as PhotoStage)}>
					{PHOTO_STAGES.map((s) => (
						<option key={s} value={s}>
							{PHOTO_LABELS.stage[s]}
						</option>
					))}
				</select>
			</label>
		</div>
	);
}

export function Uploader({ target, specimenId, checkId, defaultStage, onRecorded }: UploaderProps) {
	const [view, setView] = useState<PhotoView>('front');
	const [stage, setStage] = useState<PhotoStage>(defaultStage);
	const { verdicts, follow } = useUploadVerdicts(onRecorded);
	const [uppy] = useState(() => createPhotoUppy(`meniscus-photos-${target}`, { specimenId, ...(checkId ? { checkId } : {}), view: 'front', stage: defaultStage }));

	// New files take the view and stage chosen above the drop area.
	useEffect(() => {
		uppy.setMeta({ view, stage });
	}, [uppy, view, stage]);
	useEffect(() => onUploaded(uppy, follow), [uppy, follow]);
	useEffect(() => () => uppy.destroy(), [uppy]);

	return (
		<div className="space-y-3">
			<ViewStagePicker view={view} stage={stage} onView={setView} onStage={setStage} />
			<p className="text-xs text-ink-500">Each file's view and stage can be changed before upload with its edit button.</p>
			<PhotoDashboard uppy={uppy} />
			<VerdictList verdicts={verdicts} />
		</div>
	);
}
