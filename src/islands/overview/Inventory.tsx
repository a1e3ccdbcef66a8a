import { DEFAULT_NEAR_LIMIT_PERCENT, FLAMMABLE_CAUTION } from '../../lib/overview/inventory.ts';
import { registerHref } from '../../lib/overview/links.ts';
import type { InventoryRow, OverviewQuery } from '../../lib/overview/schema.ts';
import { Section } from '../dashboard/parts.tsx';

/** Spirit in each store against the limit the administrator set for it, with the standing caution. */
const STATUS = {
	over: { label: 'Over the limit', className: 'border-alert-600 bg-alert-50 text-alert-700' },
	near: { label: 'Near the limit', className: 'border-spirit-500 bg-spirit-50 text-spirit-900' },
	within: { label: 'Within the limit', className: 'border-glass-600 bg-glass-50 text-glass-900' },
	'no-limit': { label: 'No limit set', className: 'border-ink-200 bg-ink-50 text-ink-700' },
} as const;

const litres = (ml: number) => `${(ml / 1000).toLocaleString('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 1 })} L`;

export function Inventory({ rows, collection, filters }: { rows: InventoryRow[]; collection: string | null; filters: OverviewQuery }) {
	return (
		<Section title="Flammable fluid by store" testId="overview-inventory">
			<p className="notice-caution mb-4" data-testid="flammable-caution">{FLAMMABLE_CAUTION}</p>
			<div className="overflow-x-auto">
				<table className="w-full text-left text-sm">
					<thead className="text-ink-600">
						<tr>
							<th className="py-2 pr-4 font-semibold">Store</th>
							<th className="py-2 pr-4 text-right font-semibold">Jars</th>
							<th className="py-2 pr-4 text-right font-semibold">Spirit</th>
							<th className="py-2 pr-4 text-right font-semibold">Unknown fluid</th>
							{collection && <th className="py-2 pr-4 text-right font-semibold">Of which {collection}</th>}
							<th className="py-2 pr-4 font-semibold">Against the limit</th>
						</tr>
					</thead>
					<tbody>
						{rows.map((r) => {
							const total = r.spiritMl + r.presumedMl;
							const s = STATUS[r.status];
							return (
								<tr key={r.location.id} className="border-t border-ink-100 align-top" data-testid={`inventory-${r.location.code}`}>
									<td className="py-2 pr-4">
										<a className="font-mono font-semibold text-glass-700 underline" href={registerHref({ ...filters, collection: undefined }, { location: r.location.id, flammable: 'yes' })}>{r.location.code}</a>
										<span className="block text-ink-700">{r.location.name}</span>
									</td>
									<td className="py-2 pr-4 text-right tabular-nums">
										{r.jars}
										{r.withoutLevel > 0 && <span className="block text-xs text-ink-600">{r.withoutLevel} counted full (no level)</span>}
									</td>
									<td className="py-2 pr-4 text-right tabular-nums">{r.spiritMl > 0 ? litres(r.spiritMl) : '—'}</td>
									<td className="py-2 pr-4 text-right tabular-nums">{r.presumedMl > 0 ? litres(r.presumedMl) : '—'}</td>
									{collection && <td className="py-2 pr-4 text-right tabular-nums">{litres(r.collectionMl ?? 0)}</td>}
									<td className="min-w-[14rem] py-2 pr-4">
										<span className={`inline-block rounded border px-2 py-0.5 text-xs font-semibold ${s.className}`}>{s.label}</span>
										{r.limitL !== null && r.share !== null && (
											<>
												<span className="ml-2 tabular-nums">{litres(total)} of {r.limitL.toLocaleString('en-GB')} L ({Math.round(r.share * 100)} %)</span>
												<div className="relative mt-1 h-2 rounded bg-ink-100" aria-hidden="true">
													<div className={`h-2 rounded ${r.status === 'over' ? 'bg-alert-600' : r.status === 'near' ? 'bg-spirit-500' : 'bg-glass-500'}`} style={{ width: `${Math.min(100, r.share * 100)}%` }} />
													<div className="absolute top-[-2px] h-3 w-px bg-ink-700" style={{ left: `${r.nearLimitPercent}%` }} title={`Near the limit from ${r.nearLimitPercent} %`} />
												</div>
												{r.nearLimitPercent !== DEFAULT_NEAR_LIMIT_PERCENT && <span className="mt-0.5 block text-xs text-ink-600">near from {r.nearLimitPercent} %</span>}
											</>
										)}
										{r.limitL === null && <span className="ml-2 text-ink-700">{litres(total)}</span>}
									</td>
								</tr>
							);
						})}
					</tbody>
				</table>
			</div>
			<p className="mt-3 text-xs text-ink-600">
				Volume from each jar’s inner size and its latest approved fluid level; a jar with no level is counted full, and the specimen’s own volume is not taken off, so the
				figures lean high. Spirit: ethanol, industrial methylated spirit, propan-2-ol, or a jar flagged flammable. Unknown fluid is presumed flammable until tested. A store’s total
				counts every jar in it, whatever the collection chosen above. The tick on each bar marks where “near the limit” begins (80 % unless set otherwise on the Lists page).
			</p>
		</Section>
	);
}
