import { BAND_LABELS, LEVELS, LIKELIHOOD_LABELS, SEVERITY_LABELS, band, type Band, type Rating } from '../../lib/treatment/risk.ts';

/**
 * The 5 × 5 matrix with a hazard's rating before controls (B) and its residual rating (R). Each
 * cell names its band in words as well as in colour, so the matrix reads without colour.
 */
export const BAND_STYLE: Record<Band, string> = {
	low: 'bg-glass-100 text-glass-900',
	medium: 'bg-spirit-100 text-spirit-900',
	high: 'bg-spirit-300 text-spirit-900',
	'very-high': 'bg-alert-600 text-white',
};

export function BandBadge({ rating }: { rating: Rating }) {
	const b = band(rating.likelihood * rating.severity);
	return (
		<span className={`inline-flex items-center rounded px-2 py-0.5 text-xs font-semibold ${BAND_STYLE[b]}`}>
			{BAND_LABELS[b]} ({rating.likelihood * rating.severity})
		</span>
	);
}

export function RiskMatrix({ inherent, residual, label }: { inherent: Rating; residual: Rating; label: string }) {
	return (
		<table className="border-collapse text-[11px]" aria-label={label}>
			<caption className="sr-only">{label}: likelihood down, severity across; B before controls, R residual.</caption>
			<thead>
				<tr>
					<th className="p-1 text-left font-normal text-ink-600">Likelihood ↓ · Severity →</th>
					{LEVELS.map((s) => (
						<th key={s} scope="col" className="w-12 p-1 font-normal text-ink-600" title={SEVERITY_LABELS[s]}>
							{s}
						</th>
					))}
				</tr>
			</thead>
			<tbody>
				{[...LEVELS].reverse().map((l) => (
					<tr key={l}>
						<th scope="row" className="p-1 text-right font-normal text-ink-600" title={LIKELIHOOD_LABELS[l]}>
							{l} {LIKELIHOOD_LABELS[l]}
						</th>
						{LEVELS.map((s) => {
							const b = band(l * s);
							const marks = [inherent.likelihood === l && inherent.severity === s ? 'B' : '', residual.likelihood === l && residual.severity === s ? 'R' : ''].join('');
							return (
								<td key={s} className={`h-8 w-12 border border-white text-center ${BAND_STYLE[b]}`} title={`${BAND_LABELS[b]} (${l * s})`}>
									<span className="font-bold">{marks}</span>
									{!marks && <span className="opacity-60">{l * s}</span>}
								</td>
							);
						})}
					</tr>
				))}
			</tbody>
		</table>
	);
}
