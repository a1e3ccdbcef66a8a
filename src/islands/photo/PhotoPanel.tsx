import { useQuery, useQueryClient } from '@tanstack/react-query';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import type { PhotoRecord } from '../../lib/photos/view.ts';
import type { CheckView } from '../../lib/check/view.ts';
import { stageForReason } from '../../lib/photos/uploadPolicy.ts';
import { PhotoGrid } from './PhotoGrid.tsx';
import { Uploader } from './Uploader.tsx';

/**
 * The photographs of a condition check or of a specimen: the recorded ones as thumbnails, and for
 * those who may add to this record, the uploader. A check takes photos only while it can be edited.
 */
type Props = { role: string } & ({ checkId: string; specimenId?: undefined } | { specimenId: string; checkId?: undefined });

export default function PhotoPanel(props: Props) {
	return (
		<QueryRoot>
			{props.checkId ? <CheckPhotos checkId={props.checkId} role={props.role} /> : <SpecimenPhotos specimenId={props.specimenId!} role={props.role} />}
		</QueryRoot>
	);
}

function CheckPhotos({ checkId, role }: { checkId: string; role: string }) {
	const check = useQuery({ queryKey: ['check', checkId], queryFn: () => api<{ check: CheckView }>(`/api/checks/${checkId}`) });
	const photos = useQuery({ queryKey: ['photos', 'check', checkId], queryFn: () => api<{ photos: PhotoRecord[] }>(`/api/checks/${checkId}/photos`) });
	const qc = useQueryClient();
	const c = check.data?.check;
	const editable = role === 'conservator' && (c?.state === 'draft' || c?.state === 'returned');
	return (
		<Section title="Photographs of this check" error={check.error ?? photos.error}>
			{photos.data && <PhotoGrid photos={photos.data.photos} empty={editable ? 'No photographs yet. Add them below.' : 'No photographs were taken for this check.'} />}
			{c && editable && <Uploader target={`check-${checkId}`} specimenId={c.specimen.id} checkId={checkId} defaultStage={stageForReason(c.reason)} onRecorded={() => qc.invalidateQueries({ queryKey: ['photos', 'check', checkId] })} />}
		</Section>
	);
}

function SpecimenPhotos({ specimenId, role }: { specimenId: string; role: string }) {
	const photos = useQuery({ queryKey: ['photos', 'specimen', specimenId], queryFn: () => api<{ photos: PhotoRecord[] }>(`/api/specimens/${specimenId}/photos`) });
	const qc = useQueryClient();
	const mayUpload = role === 'conservator' || role === 'admin';
	return (
		<Section title="Photographs" error={photos.error}>
			{photos.data && <PhotoGrid photos={photos.data.photos} empty="No photographs of this specimen yet." />}
			<p className="text-sm">
				<a className="text-glass-700 underline" href={`/api/specimens/${specimenId}/manifest`} data-testid="iiif-manifest">IIIF manifest</a>
				{' '}of these photographs, with their marks: any IIIF viewer the museum runs can open it for someone signed in here.
			</p>
			{mayUpload && (
				<details className="rounded-md border border-ink-100 p-3">
					<summary className="cursor-pointer text-sm font-semibold">Add photographs of the specimen (outside a check)</summary>
					<div className="mt-3">
						<Uploader target={`specimen-${specimenId}`} specimenId={specimenId} defaultStage="as-found" onRecorded={() => qc.invalidateQueries({ queryKey: ['photos', 'specimen', specimenId] })} />
					</div>
				</details>
			)}
		</Section>
	);
}

function Section({ title, error, children }: { title: string; error: Error | null; children: React.ReactNode }) {
	return (
		<section className="card space-y-4" aria-label={title}>
			<h2 className="text-lg">{title}</h2>
			{error ? <p className="notice-error" role="alert">{error.message}</p> : children}
		</section>
	);
}
