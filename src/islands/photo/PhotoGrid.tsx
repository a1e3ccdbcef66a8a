import type { PhotoRecord } from '../../lib/photos/view.ts';
import { PHOTO_LABELS } from '../../lib/photos/vocabulary.ts';

/** Thumbnails of recorded photographs, each linking to its photo page. */
export function PhotoGrid({ photos, empty }: { photos: PhotoRecord[]; empty: string }) {
	if (photos.length === 0) return <p className="text-sm text-ink-500">{empty}</p>;
	return (
		<ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" aria-label="Photographs">
			{photos.map((p) => (
				<li key={p.id}>
					<a href={p.urls.page} className="group block overflow-hidden rounded-md border border-ink-100 bg-white focus-visible:outline-glass-600">
						<img src={p.urls.thumbnail} alt={`${PHOTO_LABELS.view[p.view]}, ${PHOTO_LABELS.stage[p.stage].toLowerCase()}`} loading="lazy" className="aspect-[4/3] w-full bg-ink-50 object-contain" />
						<span className="block px-2 py-1 text-xs">
							<span className="font-semibold">{PHOTO_LABELS.view[p.view]}</span> · {PHOTO_LABELS.stage[p.stage]}
							<span className="block truncate text-ink-500">{p.captured.raw ? p.captured.raw.slice(0, 10).replaceAll(':', '-') : p.fileName}</span>
						</span>
					</a>
				</li>
			))}
		</ul>
	);
}
