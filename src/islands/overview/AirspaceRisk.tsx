import type { Overview } from '../../lib/overview/schema.ts';
import { Empty, Section } from '../dashboard/parts.tsx';

/**
 * Jars filled above the level their store's warmest temperature allows (airspace), with how much to
 * draw off or a cooler store where they would be safe as they are.
 */
export function AirspaceRisk({ airspace }: { airspace: Overview['airspace'] }) {
	return (
		<Section title="Airspace at risk" testId="overview-airspace">
			<p className="-mt-2 mb-4 text-sm text-ink-700">
				Spirit and formalin expand as a store warms. These jars were filled above the level that keeps the fluid off the lid at their store’s warmest expected temperature,
				from the OIML R 22 densities and the glass’s own expansion. Opening a jar of spirit to draw fluid off is work for your organisation’s risk assessment and local
				regulations: flammable vapour, no ignition sources.
			</p>
			{airspace.rows.length === 0 ? (
				<Empty>No jar with a recorded level stands above its safe filling level for its store’s warmest temperature.</Empty>
			) : (
				<div className="overflow-x-auto">
					<table className="w-full text-left text-sm">
						<thead className="text-ink-600">
							<tr>
								<th className="py-2 pr-4 font-semibold">Specimen</th>
								<th className="py-2 pr-4 font-semibold">Store (warmest)</th>
								<th className="py-2 pr-4 text-right font-semibold">Level / safe level</th>
								<th className="py-2 pr-4 text-right font-semibold">Draw off</th>
								<th className="py-2 font-semibold">Or move it to</th>
							</tr>
						</thead>
						<tbody>
							{airspace.rows.map((r) => (
								<tr key={r.id} className="border-t border-ink-100 align-top" data-testid="airspace-row">
									<td className="py-2 pr-4">
										<a className="font-mono font-semibold text-glass-700 underline" href={`/specimens/${r.id}#history`}>{r.objectNumber}</a>
										<span className="block text-ink-700">{r.title}</span>
										<span className="block text-xs text-ink-600">
											{r.fluidBasis === 'water' ? 'formalin, taken as water' : `${r.percentVol.toFixed(1)} % vol${r.fluidBasis === 'assumed' ? ' (assumed: not measured)' : ''}`}
											{`, filled at ${r.fillTempC} °C${r.fillTempAssumed ? ' (assumed: no reading)' : ''}`}
										</span>
									</td>
									<td className="py-2 pr-4"><span className="font-mono">{r.location.code}</span> ({r.warmestC} °C)</td>
									<td className="whitespace-nowrap py-2 pr-4 text-right tabular-nums">
										{r.levelMm.toFixed(1)} / {r.safeLevelMm.toFixed(1)} mm
										<span className="block text-xs text-ink-600">lid at {r.innerHeightMm} mm · {r.checkedOn}</span>
									</td>
									<td className="whitespace-nowrap py-2 pr-4 text-right font-semibold tabular-nums text-alert-700">
										{Math.ceil(r.drawOffMl).toLocaleString('en-GB')} mL
										<span className="block text-xs font-normal text-ink-700">{(Math.ceil(r.drawOffMm * 10) / 10).toFixed(1)} mm of level</span>
									</td>
									<td className="py-2">
										{r.saferStores.length === 0
											? <span className="text-ink-600">No cooler store that suits it</span>
											: r.saferStores.map((s) => <span key={s.id} className="mr-2 inline-block"><span className="font-mono font-semibold">{s.code}</span> ({s.tempMaxC} °C)</span>)}
									</td>
								</tr>
							))}
						</tbody>
					</table>
				</div>
			)}
			<p className="mt-3 text-xs text-ink-600">
				Filling temperature: the temperature recorded with the level’s reading, or 20 °C where none was recorded. Strength: the real strength measured at that check, or 70 % vol where
				none was; formalin is taken as water. Propan-2-ol and unknown fluids are not assessed (the formula is for ethanol–water only). A cooler store is offered only if it would keep
				the jar safe as filled; for a flammable jar, only a store with a flammable limit set and room under it.
				{airspace.locationsWithoutTemperature > 0 && ` ${airspace.locationsWithoutTemperature} location${airspace.locationsWithoutTemperature === 1 ? ' has' : 's have'} no warmest temperature set, so ${airspace.locationsWithoutTemperature === 1 ? 'its' : 'their'} jars were not assessed.`}
				{airspace.truncated && ' More jars are at risk than this list shows; the largest excess comes first.'}
			</p>
		</Section>
	);
}
