import { Answer, CalculatorCard, NumberField, fmt, toNumber, useCalculator, useFields } from './parts.tsx';

/** Bringing spirit you have down to a wanted strength with water. */
export function WaterCalculator() {
	const f = useFields({ from: '95', to: '70', volume: '100' });
	const calc = useCalculator<unknown, { waterMl: number; naiveWaterMl: number }>('/api/fluid/water');
	return (
		<CalculatorCard
			id="water"
			title="Bring spirit down"
			intro="Water to add to spirit you have, to bring it down to a wanted strength."
			state={calc}
			onCalculate={() => calc.mutate({ fromPercentVol: toNumber(f.values.from), toPercentVol: toNumber(f.values.to), volumeMl: toNumber(f.values.volume) })}
			result={
				calc.data && (
					<Answer
						main={`Add ${fmt(calc.data.waterMl, 1)} mL of water`}
						working={<p>V1C1 = V2C2 would say {fmt(calc.data.naiveWaterMl, 1)} mL; the mix contracts, so more water is needed (OIML R 22 densities, 20 °C).</p>}
					/>
				)
			}
		>
			<NumberField label="Strength now" unit="% vol" {...f.bind('from')} />
			<NumberField label="Strength wanted" unit="% vol" {...f.bind('to')} />
			<NumberField label="Volume of spirit" unit="mL" {...f.bind('volume')} />
		</CalculatorCard>
	);
}
