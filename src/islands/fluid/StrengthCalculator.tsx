import { Answer, CalculatorCard, NumberField, SelectField, fmt, toNumber, useCalculator, useFields } from './parts.tsx';
import type { StrengthCorrection } from '../../lib/fluid/alcoholometry.ts';

/** Alcohol-meter reading + thermometer → real strength at 20 °C (OIML R 22). */
export function StrengthCalculator() {
	const f = useFields({ reading: '70', temp: '25', glass: 'soda-lime' });
	const calc = useCalculator<unknown, StrengthCorrection>('/api/fluid/strength');
	const { reading, temp } = f.values;
	return (
		<CalculatorCard
			id="strength"
			title="Strength at 20 °C"
			intro="Read the alcohol meter and the thermometer in the same sample. Meters are calibrated at 20 °C: a warm sample reads high, a cold one low."
			state={calc}
			onCalculate={() => calc.mutate({ readingPercentVol: toNumber(reading), tempC: toNumber(temp), glass: f.values.glass })}
			result={
				calc.data && (
					<Answer
						main={`Real strength: ${fmt(calc.data.realPercentVol)} % vol at 20 °C`}
						working={
							<>
								<p>
									The reading stands for {fmt(calc.data.markedDensityKgM3, 2)} kg/m³ at 20 °C; corrected for the meter’s glass (
									{calc.data.glassExpansionPerK * 1e6} × 10⁻⁶ /K), the sample’s density is {fmt(calc.data.liquidDensityKgM3, 2)} kg/m³.
								</p>
								<p>Ethanol mass fraction {fmt(100 * calc.data.massFraction, 2)} % mas. Density formula: OIML R 22 (1975).</p>
							</>
						}
					/>
				)
			}
		>
			<NumberField label="Meter reading" unit="% vol" {...f.bind('reading')} />
			<NumberField label="Sample temperature" unit="°C" hint="−20 to +40 °C" {...f.bind('temp')} />
			<SelectField
				label="Meter glass"
				{...f.bind('glass')}
				options={[
					['soda-lime', 'Soda-lime (most meters)'],
					['borosilicate', 'Borosilicate glass'],
				]}
			/>
		</CalculatorCard>
	);
}
