/**
 * A specimen as an IIIF Presentation API 3.0 Manifest (https://iiif.io/api/presentation/3.0/): one
 * Canvas per ready photograph, in chronological order (check date, then capture time), so a viewer
 * pages through the jar's visual history from the oldest view. Each canvas is painted with the
 * display copy, with the photo's level-0 IIIF Image API 3 service for deep zoom, and references an
 * AnnotationPage of the photo's marks (served separately, so the manifest stays small). Pure: the
 * server gathers the facts and this builds the JSON.
 */
export const PRESENTATION_CONTEXT = 'http://iiif.io/api/presentation/3/context.json';
export const MANIFEST_CONTENT_TYPE = `application/ld+json;profile="${PRESENTATION_CONTEXT}"`;

export type LanguageMap = { en: string[] };
const en = (s: string): LanguageMap => ({ en: [s] });

export interface ManifestCanvasInput {
	photoId: string;
	/** Full-resolution size in pixels (upright). */
	width: number;
	height: number;
	label: string;
	image: { url: string; width: number; height: number };
	/** The IIIF Image API base (the folder of info.json), or null when the tiles are not made yet. */
	service: string | null;
}

export interface ManifestInput {
	/** The manifest's own absolute URL, as requested. */
	url: string;
	title: string;
	objectNumber: string;
	summary: string;
	metadata: [string, string][];
	canvases: ManifestCanvasInput[];
}

export const canvasId = (manifestUrl: string, photoId: string) => `${manifestUrl}/canvas/${photoId}`;
export const annotationPageId = (manifestUrl: string, photoId: string) => `${manifestUrl}/annotations/${photoId}`;

export function buildManifest(m: ManifestInput) {
	return {
		'@context': PRESENTATION_CONTEXT,
		id: m.url,
		type: 'Manifest',
		label: en(`${m.objectNumber}: ${m.title}`),
		metadata: m.metadata.filter(([, v]) => v !== '').map(([label, value]) => ({ label: en(label), value: en(value) })),
		summary: en(m.summary),
		behavior: ['individuals'],
		items: m.canvases.map((c) => {
			const id = canvasId(m.url, c.photoId);
			return {
				id,
				type: 'Canvas',
				label: en(c.label),
				width: c.width,
				height: c.height,
				items: [
					{
						id: `${id}/page`,
						type: 'AnnotationPage',
						items: [
							{
								id: `${id}/page/image`,
								type: 'Annotation',
								motivation: 'painting',
								body: {
									id: c.image.url,
									type: 'Image',
									format: 'image/jpeg',
									width: c.image.width,
									height: c.image.height,
									...(c.service ? { service: [{ id: c.service, type: 'ImageService3', profile: 'level0' }] } : {}),
								},
								target: id,
							},
						],
					},
				],
				annotations: [{ id: annotationPageId(m.url, c.photoId), type: 'AnnotationPage' }],
			};
		}),
	};
}
export type Manifest = ReturnType<typeof buildManifest>;
