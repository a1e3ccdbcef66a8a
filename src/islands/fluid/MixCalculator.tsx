import { Answer, CalculatorCard, NumberField, fmt, toNumber, useCalculator, useFields } from './parts.tsx';
import type { DiluteResult } from '../../lib/fluid/mixing.ts';

/** Making a volume of spirit at a strength from stock and water, by mass balance. */
export function MixCalculator() {
	const f = useFields({ stock: '96', target: '70', volume: '1000' });
	const calc = useCalculator<unknown, DiluteResult>('/api/fluid/dilute');
	return (
		<CalculatorCard
			id="mix"
			title="Make up spirit"
			intro="Stock spirit and water for a volume at a strength. Ethanol and water shrink when mixed, so the water is more than V1C1 = V2C2 suggests. Let a fresh mix stand about a day before use: it warms on mixing."
			state={calc}
			onCalculate={() =>
				calc.mutate({ stockPercentVol: toNumber(f.values.stock), targetPercentVol: toNumber(f.values.target), targetVolumeMl: toNumber(f.values.volume) })
			}
			result={
				calc.data && (
					<Answer
						main={`${fmt(calc.data.stockMl, 0)} mL stock + ${fmt(calc.data.waterMl, 0)} mL water`}
						working={
							<>
								<p>
									V1C1 = V2C2 gives {fmt(calc.data.naiveStockMl, 0)} mL stock + {fmt(calc.data.naiveWaterMl, 0)} mL water: {fmt(calc.data.waterMl - calc.data.naiveWaterMl, 0)} mL of
									water short.
								</p>
								<p>The two volumes add up to {fmt(calc.data.contractionMl, 1)} mL more than you get: that is the contraction on mixing.</p>
								<p>
									Densities at 20 °C (OIML R 22): stock {fmt(calc.data.densities.stockKgM3, 2)}, water {fmt(calc.data.densities.waterKgM3, 2)}, mix{' '}
									{fmt(calc.data.densities.targetKgM3, 2)} kg/m³.
								</p>
							</>
						}
					/>
				)
			}
		>
			<NumberField label="Stock strength" unit="% vol" {...f.bind('stock')} />
			<NumberField label="Target strength" unit="% vol" {...f.bind('target')} />
			<NumberField label="Volume wanted" unit="mL" {...f.bind('volume')} />
		</CalculatorCard>
	);
}
