import { Answer, CalculatorCard, NumberField, fmt, toNumber, useCalculator, useFields } from './parts.tsx';
import type { TopUpResult } from '../../lib/fluid/mixing.ts';

/** Restoring a jar's level and strength by adding stock and water to what is left. */
export function TopUpCalculator() {
	const f = useFields({ current: '850', currentStrength: '66', full: '1000', target: '70', stock: '96' });
	const calc = useCalculator<unknown, TopUpResult>('/api/fluid/top-up');
	const v = f.values;
	return (
		<CalculatorCard
			id="topup"
			title="Top up a jar"
			intro="What to add to the fluid left in a jar to bring it back to its full volume and target strength. Measure the strength of what is left first; topping up by habit is how jars drift."
			state={calc}
			onCalculate={() =>
				calc.mutate({
					currentVolumeMl: toNumber(v.current),
					currentPercentVol: toNumber(v.currentStrength),
					targetVolumeMl: toNumber(v.full),
					targetPercentVol: toNumber(v.target),
					stockPercentVol: toNumber(v.stock),
				})
			}
			result={
				calc.data &&
				(calc.data.possible ? (
					<Answer
						main={`Add ${fmt(calc.data.stockMl, 0)} mL stock and ${fmt(calc.data.waterMl, 0)} mL water`}
						working={
							<p>
								V1C1 = V2C2 would say {fmt(calc.data.naiveStockMl, 0)} mL stock and {fmt(calc.data.naiveWaterMl, 0)} mL water (mass balance with OIML R 22 densities,
								volumes at 20 °C).
							</p>
						}
					/>
				) : (
					<div className="notice-caution" data-testid="answer">
						<p className="font-semibold">Adding alone cannot do this.</p>
						<p>{calc.data.message}</p>
						{calc.data.bestPercentVol !== null && <p>Filling to the full volume by adding alone would give {fmt(calc.data.bestPercentVol)} % vol.</p>}
					</div>
				))
			}
		>
			<NumberField label="Fluid left in the jar" unit="mL" {...f.bind('current')} />
			<NumberField label="Its strength" unit="% vol" hint="Real strength at 20 °C" {...f.bind('currentStrength')} />
			<NumberField label="Full volume" unit="mL" {...f.bind('full')} />
			<NumberField label="Target strength" unit="% vol" {...f.bind('target')} />
			<NumberField label="Stock strength" unit="% vol" {...f.bind('stock')} />
		</CalculatorCard>
	);
}
