import { useEffect, useRef, useState, type DragEvent } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import type { FileMatch } from '../../lib/photos/matching.ts';
import { MAX_FILES_PER_BATCH } from '../../lib/photos/limits.ts';
import type { PhotoStage, PhotoView } from '../../lib/photos/vocabulary.ts';
import { UPLOAD_RESTRICTIONS } from '../../lib/photos/uploadPolicy.ts';
import { createPhotoUppy, onUploaded } from './photoUppy.ts';
import { useUploadVerdicts } from './useUploadVerdicts.ts';
import { VerdictList } from './VerdictList.tsx';
import { PhotoDashboard, ViewStagePicker } from './Uploader.tsx';

/**
 * Photographs of many specimens at once, dropped on the register: each file is matched to a
 * specimen by the object number in its name; the matches are shown for confirmation, unmatched or
 * ambiguous files wait for the person to choose, and only confirmed files are uploaded (as photos
 * of the specimen, outside any check).
 */
interface SpecimenRef {
	id: string;
	objectNumber: string;
	title: string;
}
interface Row {
	file: File;
	match: FileMatch;
	specimen: SpecimenRef | null;
	confirmed: boolean;
}

const accepted = (f: File) => UPLOAD_RESTRICTIONS.allowedFileTypes.some((t) => (t.startsWith('.') ? f.name.toLowerCase().endsWith(t) : f.type === t));

export default function BatchPhotos() {
	return (
		<QueryRoot>
			<Batch />
		</QueryRoot>
	);
}

function Batch() {
	const [rows, setRows] = useState<Row[]>([]);
	const [skipped, setSkipped] = useState<string[]>([]);
	const [busy, setBusy] = useState(false);
	const [error, setError] = useState<string | null>(null);
	const [view, setView] = useState<PhotoView>('front');
	const [stage, setStage] = useState<PhotoStage>('as-found');
	const [started, setStarted] = useState(false);
	const { verdicts, follow } = useUploadVerdicts(() => {});
	const [uppy] = useState(() => createPhotoUppy('meniscus-photos-batch', { view: 'front', stage: 'as-found' }));
	useEffect(() => onUploaded(uppy, follow), [uppy, follow]);
	useEffect(() => () => uppy.destroy(), [uppy]);
	const input = useRef<HTMLInputElement>(null);

	async function take(list: FileList | File[]) {
		setError(null);
		const files = [...list];
		const ok = files.filter(accepted).slice(0, MAX_FILES_PER_BATCH);
		setSkipped(files.filter((f) => !accepted(f)).map((f) => f.name));
		if (ok.length === 0) return;
		setBusy(true);
		try {
			const { matches } = await api<{ matches: (FileMatch & { specimen: SpecimenRef | null })[] }>('/api/photos/match', { method: 'POST', body: { fileNames: ok.map((f) => f.name) } });
			setRows(ok.map((file, i) => ({ file, match: matches[i]!, specimen: matches[i]!.specimen, confirmed: matches[i]!.specimen !== null })));
		} catch (e) {
			setError((e as Error).message);
		} finally {
			setBusy(false);
		}
	}

	const onDrop = (e: DragEvent) => {
		e.preventDefault();
		void take(e.dataTransfer.files);
	};
	const update = (i: number, patch: Partial<Row>) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, ...patch } : r)));
	const ready = rows.filter((r) => r.confirmed && r.specimen);

	function upload() {
		for (const r of ready) {
			uppy.addFile({ name: r.file.name, type: r.file.type, data: r.file, meta: { specimenId: r.specimen!.id, checkId: '', view, stage } as never });
		}
		setStarted(true);
		setRows((rs) => rs.filter((r) => !(r.confirmed && r.specimen)));
		void uppy.upload();
	}

	return (
		<div className="space-y-4">
			<div
				onDragOver={(e) => e.preventDefault()}
				onDrop={onDrop}
				className="flex min-h-32 flex-col items-center justify-center gap-2 rounded-md border-2 border-dashed border-ink-300 bg-ink-50 p-6 text-center"
				data-testid="batch-drop"
			>
				<p className="text-sm">Drop photographs here; each is matched to a specimen by the object number in its file name (e.g. <code>STC.1898.014 front.jpg</code>).</p>
				<button type="button" className="btn-secondary" onClick={() => input.current?.click()} disabled={busy}>
					Choose files…
				</button>
				<input ref={input} type="file" multiple accept={UPLOAD_RESTRICTIONS.allowedFileTypes.join(',')} className="sr-only" aria-label="Photographs to match" onChange={(e) => e.target.files && void take(e.target.files)} />
			</div>
			{busy && <p role="status">Matching the file names…</p>}
			{error && <p className="notice-error" role="alert">{error}</p>}
			{skipped.length > 0 && <p className="notice-caution">Not photographs of an accepted type, left out: {skipped.join(', ')}</p>}
			{rows.length > 0 && (
				<div className="space-y-3">
					<ViewStagePicker view={view} stage={stage} onView={setView} onStage={setStage} />
					<table className="w-full text-sm" aria-label="Matches to confirm">
						<thead>
							<tr className="border-b border-ink-200 text-left">
								<th className="py-1 pr-3">Upload</th>
								<th className="py-1 pr-3">File</th>
								<th className="py-1 pr-3">Specimen</th>
							</tr>
						</thead>
						<tbody>
							{rows.map((r, i) => (
								<tr key={`${r.file.name}-${i}`} className="border-b border-ink-100 align-top">
									<td className="py-2 pr-3">
										<input type="checkbox" aria-label={`Upload ${r.file.name}`} checked={r.confirmed} disabled={!r.specimen} onChange={(e) => update(i, { confirmed: e.target.checked })} />
									</td>
									<td className="py-2 pr-3 font-mono">{r.file.name}</td>
									<td className="py-2 pr-3">
										{r.specimen ? (
											<span>
												<span className="font-semibold">{r.specimen.objectNumber}</span> · {r.specimen.title}
												{r.match.how === 'normalised' && <span className="ml-2 text-xs text-ink-500">(matched ignoring leading zeros)</span>}
												<button type="button" className="ml-2 text-xs text-glass-700 underline" onClick={() => update(i, { specimen: null, confirmed: false })}>
													change
												</button>
											</span>
										) : (
											<Assign note={r.match.how === 'ambiguous' ? `Could be ${r.match.candidates.join(' or ')}` : 'No object number found in the name'} onPick={(s) => update(i, { specimen: s, confirmed: true })} />
										)}
									</td>
								</tr>
							))}
						</tbody>
					</table>
					<button type="button" className="btn-primary" disabled={ready.length === 0} onClick={upload}>
						Upload {ready.length} confirmed photograph{ready.length === 1 ? '' : 's'}
					</button>
				</div>
			)}
			{started && <PhotoDashboard uppy={uppy} height={300} />}
			<VerdictList verdicts={verdicts} />
		</div>
	);
}

/** Finds a specimen for an unmatched file by searching the register. */
function Assign({ note, onPick }: { note: string; onPick: (s: SpecimenRef) => void }) {
	const [q, setQ] = useState('');
	const [hits, setHits] = useState<SpecimenRef[]>([]);
	useEffect(() => {
		if (q.trim().length < 2) return setHits([]);
		const t = setTimeout(() => {
			api<{ rows: SpecimenRef[] }>(`/api/specimens?q=${encodeURIComponent(q.trim())}&pageSize=10`)
				.then((r) => setHits(r.rows))
				.catch(() => setHits([]));
		}, 250);
		return () => clearTimeout(t);
	}, [q]);
	return (
		<div>
			<p className="text-xs text-spirit-900">{note}. Assign it:</p>
			<input className="field-input" placeholder="Search object number or title" value={q} onChange={(e) => setQ(e.target.value)} aria-label="Find the specimen" />
			{hits.length > 0 && (
				<ul className="mt-1 rounded-md border border-ink-200 bg-white">
					{hits.map((h) => (
						<li key={h.id}>
							<button type="button" className="block w-full px-3 py-1 text-left hover:bg-ink-50" onClick={() => onPick(h)}>
								<span className="font-semibold">{h.objectNumber}</span> · {h.title}
							</button>
						</li>
					))}
				</ul>
			)}
		</div>
	);
}
