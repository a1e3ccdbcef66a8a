import type { PhotoStage, PhotoView as PhotoViewName } from './vocabulary.ts';
import type { StoredExif } from './exif.ts';

/** A recorded photograph as the API shows it. `exif.private` is present only for those who may download the master. */
export interface PhotoRecord {
	id: string;
	specimen: { id: string; objectNumber: string; title: string };
	check: { id: string; state: string; checkedOn: string } | null;
	view: PhotoViewName;
	stage: PhotoStage;
	fileName: string;
	mediaType: string;
	byteSize: number;
	sha256: string;
	width: number;
	height: number;
	captured: { raw: string | null; offset: string | null; at: string | null };
	camera: string | null;
	lens: string | null;
	exif: Omit<StoredExif, 'private'> & { private?: StoredExif['private'] };
	uploadedBy: { id: string; name: string };
	uploadedAt: string;
	recordedAt: string;
	urls: { thumbnail: string; display: string; tiles: string; original: string | null; page: string };
	derivatives: { kind: string; width: number; height: number; byteSize: number }[];
	/** The latest re-hash of the master (on the photo's own page only). */
	fixity?: { checkedAt: string; outcome: 'match' | 'mismatch' | 'missing' } | null;
}
