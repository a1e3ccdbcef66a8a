import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import type { PhotoRecord } from '../../lib/photos/view.ts';
import { PHOTO_LABELS } from '../../lib/photos/vocabulary.ts';
import { formatBytes } from '../../lib/photos/limits.ts';
import { formatExposure } from '../../lib/photos/exif.ts';
import { CHECK_LABELS, type CheckState } from '../../lib/check/vocabulary.ts';
import { DeepZoom } from './DeepZoom.tsx';

/**
 * A photograph as evidence: the picture (screen size, or zoomable to full resolution through its
 * IIIF tiles), what the camera recorded, the SHA-256 of the master, and who uploaded it when.
 */
export default function PhotoDetail({ id }: { id: string }) {
	return (
		<QueryRoot>
			<Loader id={id} />
		</QueryRoot>
	);
}

function Loader({ id }: { id: string }) {
	const q = useQuery({ queryKey: ['photo', id], queryFn: () => api<{ photo: PhotoRecord }>(`/api/photos/${id}`) });
	if (q.error) return <p className="notice-error" role="alert">{q.error.message}</p>;
	if (!q.data) return <p role="status">Loading the photograph…</p>;
	return <Detail photo={q.data.photo} />;
}

const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' }) + ' UTC';

function Detail({ photo }: { photo: PhotoRecord }) {
	const [zoom, setZoom] = useState(false);
	const e = photo.exif;
	const rows: [string, string | null][] = [
		['Taken', photo.captured.raw ? `${photo.captured.raw.replace(/^(\d{4}):(\d{2}):(\d{2})/, '$1-$2-$3')}${photo.captured.offset ? ` (UTC${photo.captured.offset})` : ' (the camera recorded no time zone)'}` : null],
		['Camera', photo.camera],
		['Lens', photo.lens],
		['Exposure', [formatExposure(e.exposure.exposureTime), e.exposure.fNumber ? `f/${Number(e.exposure.fNumber.toFixed(1))}` : null, e.exposure.iso ? `ISO ${e.exposure.iso}` : null, e.exposure.focalLengthMm ? `${Number(e.exposure.focalLengthMm.toFixed(1))} mm` : null].filter(Boolean).join(' · ') || null],
		['Orientation tag', e.orientation ? String(e.orientation) : null],
		['Software', e.software],
	];
	const secret = e.private;
	return (
		<div className="space-y-6">
			<header className="space-y-1">
				<p className="text-sm text-ink-500">
					<a className="text-glass-700 underline" href={`/specimens/${photo.specimen.id}`}>{photo.specimen.objectNumber}</a> · {photo.specimen.title}
					{photo.check && (
						<>
							{' '}· <a className="text-glass-700 underline" href={`/checks/${photo.check.id}`}>check of {photo.check.checkedOn}</a> ({CHECK_LABELS.state[photo.check.state as CheckState] ?? photo.check.state})
						</>
					)}
				</p>
				<h1 className="font-serif text-2xl">
					{PHOTO_LABELS.view[photo.view]} · {PHOTO_LABELS.stage[photo.stage]}
				</h1>
			</header>
			<section aria-label="The photograph" className="space-y-2">
				<div className="flex items-center gap-3">
					<a className="btn-primary" href={`/photos/${photo.id}/marks`}>
						Condition map
					</a>
					<button type="button" className="btn-secondary" aria-pressed={zoom} onClick={() => setZoom(!zoom)}>
						{zoom ? 'Show the screen-size copy' : 'Zoom to full resolution'}
					</button>
					<span className="text-sm text-ink-500">
						{photo.width.toLocaleString('en-GB')} × {photo.height.toLocaleString('en-GB')} px
					</span>
				</div>
				{zoom ? (
					<DeepZoom infoUrl={photo.urls.tiles} alt={`${photo.specimen.objectNumber}, ${PHOTO_LABELS.view[photo.view]}`} />
				) : (
					<img src={photo.urls.display} alt={`${photo.specimen.objectNumber}, ${PHOTO_LABELS.view[photo.view].toLowerCase()} view`} className="max-h-[70vh] w-auto rounded border border-ink-200 bg-ink-50" />
				)}
			</section>
			<div className="grid gap-6 md:grid-cols-2">
				<section aria-labelledby="exif-h" className="card">
					<h2 id="exif-h" className="mb-2 font-semibold">What the camera recorded</h2>
					<dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
						{rows.map(([k, v]) => (
							<Row key={k} k={k} v={v ?? '—'} />
						))}
						{secret && <Row k="GPS position" v={secret.gps ? `${secret.gps.latitude.toFixed(5)}, ${secret.gps.longitude.toFixed(5)}` : 'none recorded'} />}
						{secret && <Row k="Serial numbers" v={[secret.bodySerial && `body ${secret.bodySerial}`, secret.lensSerial && `lens ${secret.lensSerial}`].filter(Boolean).join(', ') || 'none recorded'} />}
					</dl>
					<p className="mt-2 text-xs text-ink-500">
						The GPS position and serial numbers stay with the master original; the copies shown on screen carry no metadata.
					</p>
				</section>
				<section aria-labelledby="file-h" className="card">
					<h2 id="file-h" className="mb-2 font-semibold">The master original</h2>
					<dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
						<Row k="File name" v={photo.fileName} />
						<Row k="Type and size" v={`${photo.mediaType}, ${formatBytes(photo.byteSize)}`} />
						<Row k="SHA-256" v={<code className="break-all text-xs">{photo.sha256}</code>} />
						<Row k="Uploaded by" v={`${photo.uploadedBy.name}, ${when(photo.uploadedAt)}`} />
						<Row k="Recorded" v={when(photo.recordedAt)} />
						<Row
							k="Fixity"
							v={
								!photo.fixity ? (
									'not checked yet'
								) : photo.fixity.outcome === 'match' ? (
									`the master matched its SHA-256 on ${when(photo.fixity.checkedAt)}`
								) : (
									<strong className="text-alert-700">{photo.fixity.outcome === 'missing' ? 'the master is missing from storage' : 'the master no longer matches its SHA-256'} ({when(photo.fixity.checkedAt)}); tell an administrator</strong>
								)
							}
						/>
					</dl>
					{photo.urls.original && (
						<p className="mt-3">
							<a className="btn-secondary" href={photo.urls.original} download>
								Download the master
							</a>
						</p>
					)}
				</section>
			</div>
		</div>
	);
}

function Row({ k, v }: { k: string; v: React.ReactNode }) {
	return (
		<>
			<dt className="text-ink-500">{k}</dt>
			<dd>{v}</dd>
		</>
	);
}
