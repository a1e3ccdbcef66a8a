import { CHECK_LABELS, type Grade } from '../../lib/check/vocabulary.ts';

/**
 * A grade as a badge. Colour is never the only cue: the word is always there and the number of
 * filled bars (1–4) rises with severity. Our own palette, defined here once.
 */
export const GRADE_STYLE: Record<Grade, { className: string; bars: number; fill: string }> = {
	good: { className: 'border-glass-600 bg-glass-50 text-glass-900', bars: 1, fill: 'bg-glass-600' },
	fair: { className: 'border-spirit-500 bg-spirit-50 text-spirit-900', bars: 2, fill: 'bg-spirit-500' },
	poor: { className: 'border-spirit-700 bg-spirit-100 text-spirit-900', bars: 3, fill: 'bg-spirit-700' },
	unacceptable: { className: 'border-alert-600 bg-alert-50 text-alert-700', bars: 4, fill: 'bg-alert-600' },
};

export function GradeBadge({ grade }: { grade: Grade | null }) {
	if (!grade) return <span className="text-ink-600">not checked</span>;
	const s = GRADE_STYLE[grade];
	return (
		<span className={`inline-flex items-center gap-1.5 rounded border px-2 py-0.5 text-xs font-semibold ${s.className}`}>
			<span aria-hidden="true" className="flex gap-px">
				{[1, 2, 3, 4].map((i) => (
					<span key={i} className={`h-2.5 w-1 rounded-sm ${i <= s.bars ? 'bg-current' : 'bg-current opacity-20'}`} />
				))}
			</span>
			{CHECK_LABELS.grade[grade]}
		</span>
	);
}
