import { FORMALDEHYDE_LIMITS, GOVERNING_STATEMENT, HAZARD_CAUTIONS } from '../../lib/treatment/cautions.ts';
import type { HazardKind } from '../../lib/treatment/hazards.ts';

/** The cautions for the hazards in view, with reference values and the governing statement. */
export function HazardCautions({ kinds }: { kinds: HazardKind[] }) {
	const shown = [...new Set(kinds)].filter((k) => HAZARD_CAUTIONS[k]);
	return (
		<aside className="notice-caution space-y-2" aria-label="Cautions" data-testid="hazard-cautions">
			<p className="font-semibold">Cautions for this work</p>
			{shown.length > 0 && (
				<ul className="list-disc space-y-1 pl-5">
					{shown.map((k) => (
						<li key={k}>{HAZARD_CAUTIONS[k]}</li>
					))}
				</ul>
			)}
			{kinds.includes('formaldehyde') && (
				<table className="mt-2 text-left text-xs">
					<caption className="text-left font-semibold">Formaldehyde exposure limits (reference values)</caption>
					<tbody>
						{FORMALDEHYDE_LIMITS.map((l) => (
							<tr key={l.where}>
								<th scope="row" className="py-0.5 pr-3 font-normal">{l.where}</th>
								<td className="py-0.5 pr-3">{l.value}</td>
								<td className="py-0.5 text-spirit-800">{l.source}</td>
							</tr>
						))}
					</tbody>
				</table>
			)}
			<p>{GOVERNING_STATEMENT}</p>
		</aside>
	);
}
