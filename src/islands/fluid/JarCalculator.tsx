import { Answer, CalculatorCard, NumberField, SelectField, fmt, toNumber, useCalculator, useFields } from './parts.tsx';
import type { AirspaceResult } from '../../lib/fluid/airspace.ts';

interface JarVolume {
	innerVolumeMl: number;
	mlPerMm: number;
	fluidVolumeMl: number | null;
}

const SHAPES: [string, string][] = [
	['cylinder', 'Cylinder'],
	['oval', 'Oval (elliptic)'],
	['rectangular', 'Rectangular'],
];

/** Jar volume, fluid at a level, and the airspace to leave when filling. */
export function JarCalculator() {
	const f = useFields({ shape: 'cylinder', width: '100', depth: '', height: '200', level: '170', displacement: '0', material: 'soda-lime', strength: '70', fill: '18', max: '28' });
	const volume = useCalculator<unknown, JarVolume>('/api/fluid/jar');
	const air = useCalculator<unknown, AirspaceResult>('/api/fluid/airspace');
	const v = f.values;
	const jar = { shape: v.shape, widthMm: toNumber(v.width), depthMm: v.shape === 'cylinder' ? null : toNumber(v.depth), heightMm: toNumber(v.height) };
	const displacementMl = v.displacement.trim() === '' ? 0 : toNumber(v.displacement);
	const [widthLabel, depthLabel] =
		v.shape === 'cylinder' ? ['Inner diameter', ''] : v.shape === 'oval' ? ['Major axis (inside)', 'Minor axis (inside)'] : ['Inner width', 'Inner depth'];
	return (
		<CalculatorCard
			id="jar"
			title="Jar volume and airspace"
			intro="Inner dimensions, measured inside the glass. The airspace is the least headspace that keeps the fluid off the lid at the warmest temperature the store reaches; spirit expands about five times as much as water. Leave a margin above it: no published rule sets one."
			state={{ isPending: volume.isPending || air.isPending, error: volume.error ?? air.error }}
			onCalculate={() => {
				volume.mutate({ jar, levelMm: v.level.trim() === '' ? null : toNumber(v.level), displacementMl });
				air.mutate({ jar, material: v.material, percentVol: toNumber(v.strength), fillTempC: toNumber(v.fill), maxTempC: toNumber(v.max), displacementMl });
			}}
			result={
				volume.data &&
				air.data && (
					<Answer
						main={`Fill to at most ${fmt(air.data.maxFillLevelMm, 0)} mm: leave ${fmt(air.data.headspaceMm, 1)} mm (${fmt(air.data.headspaceMl, 0)} mL) of airspace`}
						working={
							<>
								<p>
									Inner volume {fmt(volume.data.innerVolumeMl, 0)} mL; {fmt(volume.data.mlPerMm, 2)} mL per mm of level
									{volume.data.fluidVolumeMl !== null && `; ${fmt(volume.data.fluidVolumeMl, 0)} mL of fluid at ${v.level} mm`}.
								</p>
								<p>
									From {v.fill} to {v.max} °C the fluid grows {fmt(100 * air.data.fluidExpansion, 2)} % (OIML R 22 densities {fmt(air.data.densities.fillKgM3, 2)} →{' '}
									{fmt(air.data.densities.maxKgM3, 2)} kg/m³) and the jar {fmt(100 * air.data.containerExpansion, 3)} %.
								</p>
							</>
						}
					/>
				)
			}
		>
			<SelectField label="Shape" {...f.bind('shape')} options={SHAPES} />
			<NumberField label={widthLabel} unit="mm" {...f.bind('width')} />
			{v.shape !== 'cylinder' && <NumberField label={depthLabel} unit="mm" {...f.bind('depth')} />}
			<NumberField label="Inner height to the lid" unit="mm" {...f.bind('height')} />
			<NumberField label="Fluid level now" unit="mm" hint="Above the inner base; leave empty to skip" {...f.bind('level')} />
			<NumberField label="Specimen displacement" unit="mL" hint="Volume of specimen and mount, if known" {...f.bind('displacement')} />
			<SelectField
				label="Jar material"
				{...f.bind('material')}
				options={[
					['soda-lime', 'Soda-lime glass'],
					['borosilicate', 'Borosilicate glass'],
					['acrylic', 'Acrylic'],
				]}
			/>
			<NumberField label="Fluid strength" unit="% vol" {...f.bind('strength')} />
			<NumberField label="Temperature at filling" unit="°C" {...f.bind('fill')} />
			<NumberField label="Warmest the store gets" unit="°C" {...f.bind('max')} />
		</CalculatorCard>
	);
}
