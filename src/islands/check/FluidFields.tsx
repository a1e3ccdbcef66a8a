import { useState } from 'react';
import { realStrengthAt20 } from '../../lib/fluid/alcoholometry.ts';
import type { CheckView } from '../../lib/check/view.ts';

/**
 * The fluid readings of a check, with the real strength worked out as the numbers are typed (the
 * same OIML R 22 computation the server repeats when saving).
 */
export type FluidValue = Omit<NonNullable<CheckView['fluid']>, 'realPercentVol'>;

export const emptyFluid = (): FluidValue => ({ readingPercentVol: null, tempC: null, glass: 'soda-lime', formaldehyde: 'not-tested', pH: null, levelMm: null, method: '' });

const num = (s: string): number | null => (s.trim() === '' ? null : Number(s.replace(',', '.')));
const str = (n: number | null) => (n === null || Number.isNaN(n) ? '' : String(n));

function realStrength(f: FluidValue): { value: number | null; problem: string | null } {
	if (f.readingPercentVol === null || f.tempC === null) return { value: null, problem: null };
	try {
		return { value: realStrengthAt20(f.readingPercentVol, f.tempC, f.glass), problem: null };
	} catch (e) {
		return { value: null, problem: (e as Error).message };
	}
}

type FluidErrors = Partial<Record<keyof FluidValue, { message?: string }>>;

export function FluidFields({ value, onChange, readOnly, errors }: { value: FluidValue; onChange: (v: FluidValue) => void; readOnly: boolean; errors?: FluidErrors }) {
	const set = (change: Partial<FluidValue>) => onChange({ ...value, ...change });
	// The text as typed ("68." on the way to "68.5"), beside the number it stands for.
	const [raw, setRaw] = useState(() => ({ readingPercentVol: str(value.readingPercentVol), tempC: str(value.tempC), pH: str(value.pH), levelMm: str(value.levelMm) }));
	const real = realStrength(value);
	const field = (key: 'readingPercentVol' | 'tempC' | 'pH' | 'levelMm', label: string, unit: string) => (
		<div>
			<label className="field-label" htmlFor={`fl-${key}`}>{label}</label>
			<div className="mt-1 flex">
				<input
					id={`fl-${key}`}
					inputMode="decimal"
					readOnly={readOnly}
					className="field-input mt-0 rounded-r-none"
					value={raw[key]}
					onChange={(e) => {
						setRaw((r) => ({ ...r, [key]: e.target.value }));
						set({ [key]: num(e.target.value) });
					}}
				/>
				<span className="flex min-w-touch items-center justify-center whitespace-nowrap rounded-r-md border border-l-0 border-ink-300 bg-ink-50 px-3 text-sm">{unit}</span>
			</div>
			{errors?.[key]?.message && <p className="field-error" role="alert">{errors[key]!.message}</p>}
		</div>
	);
	return (
		<div className="space-y-4">
			<div className="grid gap-4 sm:grid-cols-3">
				{field('readingPercentVol', 'Alcohol meter reading', '% vol')}
				{field('tempC', 'Sample temperature', '°C')}
				<div>
					<label className="field-label" htmlFor="fl-glass">Meter glass</label>
					<select id="fl-glass" className="field-input" disabled={readOnly} value={value.glass} onChange={(e) => set({ glass: e.target.value as FluidValue['glass'] })}>
						<option value="soda-lime">Soda-lime</option>
						<option value="borosilicate">Borosilicate</option>
					</select>
				</div>
			</div>
			<p aria-live="polite" data-testid="real-strength" className={real.problem ? 'field-error' : 'text-sm font-semibold text-glass-900'}>
				{real.problem ?? (real.value !== null ? `Real strength: ${real.value.toFixed(1)} % vol at 20 °C (OIML R 22)` : 'Enter the reading and the temperature to get the real strength.')}
			</p>
			<div className="grid gap-4 sm:grid-cols-3">
				<div>
					<label className="field-label" htmlFor="fl-formaldehyde">Formaldehyde strip</label>
					<select id="fl-formaldehyde" className="field-input" disabled={readOnly} value={value.formaldehyde} onChange={(e) => set({ formaldehyde: e.target.value as FluidValue['formaldehyde'] })}>
						<option value="not-tested">Not tested</option>
						<option value="negative">Negative</option>
						<option value="positive">Positive</option>
					</select>
				</div>
				{field('pH', 'pH', 'pH')}
				{field('levelMm', 'Fluid level above the inner base', 'mm')}
			</div>
			<div>
				<label className="field-label" htmlFor="fl-method">Method</label>
				<input id="fl-method" className="field-input" readOnly={readOnly} maxLength={500} placeholder="e.g. meter in a 250 mL cylinder; level with a steel rule at the front" value={value.method} onChange={(e) => set({ method: e.target.value })} />
			</div>
			<p className="text-xs text-ink-700">
				Meters read true only in ethanol–water; strips can show false positives in alcohol. Sample with ventilation and no ignition sources; local rules and your organisation’s risk assessment govern the work.
			</p>
		</div>
	);
}
