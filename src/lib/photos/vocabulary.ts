/**
 * The words of a record photograph: which side of the jar it shows and at what stage of the work it
 * was taken. "As found", "before treatment" and "after treatment" are the trade's own phrases for
 * documentation photographs; the view names are plain English.
 */
export const PHOTO_VIEWS = ['front', 'back', 'left', 'right', 'top', 'base', 'label', 'detail'] as const;
export type PhotoView = (typeof PHOTO_VIEWS)[number];

export const PHOTO_STAGES = ['as-found', 'before-treatment', 'after-treatment'] as const;
export type PhotoStage = (typeof PHOTO_STAGES)[number];

export const PHOTO_LABELS = {
	view: { front: 'Front', back: 'Back', left: 'Left side', right: 'Right side', top: 'Top (lid)', base: 'Base', label: 'Label', detail: 'Detail' },
	stage: { 'as-found': 'As found', 'before-treatment': 'Before treatment', 'after-treatment': 'After treatment' },
} as const satisfies { view: Record<PhotoView, string>; stage: Record<PhotoStage, string> };

/** Where an upload is in its life, from the first byte to a recorded photograph (or a refusal). */
export const UPLOAD_STATES = ['receiving', 'processing', 'recorded', 'refused', 'quarantined'] as const;
export type UploadState = (typeof UPLOAD_STATES)[number];

export const UPLOAD_STATE_LABELS: Record<UploadState, string> = {
	receiving: 'Receiving',
	processing: 'Checking and preparing',
	recorded: 'Recorded',
	refused: 'Refused',
	quarantined: 'Quarantined',
};
