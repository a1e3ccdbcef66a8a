import type { ComparisonSourcePhoto } from '../../lib/compare/view.ts';

/** The compare workspace reads the API's own types (lib/compare/view.ts). */
export type { ComparisonListItem, ComparisonSourcePhoto as SourcePhoto, ComparisonSources as Sources, ComparisonView as SavedComparison, FluidColourAnswer } from '../../lib/compare/view.ts';

/** The date a photo stands for, as the server dates it: its check's, else the day it was taken. */
export const dateOf = (p: ComparisonSourcePhoto): string => p.date;

export const photoLabel = (p: ComparisonSourcePhoto): string => `${p.date || 'undated'} · ${p.view} · ${p.stage}${p.check ? ` · check ${p.check.status}` : ''}`;
