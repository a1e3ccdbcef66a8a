import { useMutation } from '@tanstack/react-query';
import { useId, useState, type ReactNode } from 'react';
import { api, ApiError } from '../../lib/client/api.ts';

/**
 * The pieces every fluid calculator is built from: a labelled number field with its unit, the
 * calculator card with its Calculate button, the call to its API route, and number formatting.
 */
export function useCalculator<I, O>(url: string) {
	return useMutation<O, ApiError, I>({ mutationFn: (input) => api<O>(url, { method: 'POST', body: input }) });
}

/** A number typed by a person: decimal comma accepted; empty or unreadable becomes NaN (refused by the API). */
export function toNumber(s: string): number {
	const t = s.trim().replace(',', '.');
	return t === '' ? Number.NaN : Number(t);
}

export function fmt(n: number, digits = 1): string {
	return n.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
}

/** A label above its control, tied by id. */
function Labelled({ label, children }: { label: string; children: (id: string) => ReactNode }) {
	const id = useId();
	return (
		<div>
			<label className="field-label" htmlFor={id}>
				{label}
			</label>
			{children(id)}
		</div>
	);
}

export function NumberField(props: {
	label: string;
	unit: string;
	value: string;
	onChange: (v: string) => void;
	hint?: string;
	name: string;
}) {
	return (
		<Labelled label={props.label}>
			{(id) => (
				<>
					<div className="mt-1 flex items-stretch">
						<input
							id={id}
							name={props.name}
							inputMode="decimal"
							className="field-input mt-0 rounded-r-none"
							value={props.value}
							onChange={(e) => props.onChange(e.target.value)}
							aria-describedby={props.hint ? `${id}-hint` : undefined}
						/>
						<span className="flex min-w-touch items-center justify-center whitespace-nowrap rounded-r-md border border-l-0 border-ink-300 bg-ink-50 px-3 text-sm text-ink-700">
							{props.unit}
						</span>
					</div>
					{props.hint && (
						<p id={`${id}-hint`} className="mt-1 text-xs text-ink-600">
							{props.hint}
						</p>
					)}
				</>
			)}
		</Labelled>
	);
}

export function SelectField(props: { label: string; name: string; value: string; onChange: (v: string) => void; options: [string, string][] }) {
	return (
		<Labelled label={props.label}>
			{(id) => (
				<select id={id} name={props.name} className="field-input" value={props.value} onChange={(e) => props.onChange(e.target.value)}>
					{props.options.map(([v, l]) => (
						<option key={v} value={v}>
							{l}
						</option>
					))}
				</select>
			)}
		</Labelled>
	);
}

export function CalculatorCard(props: {
	id: string;
	title: string;
	intro: ReactNode;
	onCalculate: () => void;
	/** The call(s) behind the card: shows Calculating… while pending and the API's error if any. */
	state: { isPending: boolean; error: ApiError | null };
	children: ReactNode;
	result: ReactNode;
}) {
	return (
		<section className="card" aria-labelledby={`${props.id}-h`} data-testid={props.id}>
			<h2 id={`${props.id}-h`} className="text-xl font-semibold">
				{props.title}
			</h2>
			<div className="mt-1 text-sm text-ink-700">{props.intro}</div>
			<form
				className="mt-4 grid gap-4 sm:grid-cols-2"
				noValidate
				onSubmit={(e) => {
					e.preventDefault();
					props.onCalculate();
				}}
			>
				{props.children}
				<div className="sm:col-span-2">
					<button className="btn-primary" type="submit" disabled={props.state.isPending}>
						{props.state.isPending ? 'Calculating…' : 'Calculate'}
					</button>
				</div>
			</form>
			<div aria-live="polite" className="mt-4">
				{props.state.error && (
					<div className="notice-error" role="alert">
						<p>{props.state.error.message}</p>
						{props.state.error.fields.map((f) => (
							<p key={f.path}>{f.message}</p>
						))}
					</div>
				)}
				{!props.state.error && props.result}
			</div>
		</section>
	);
}

/** A result: the answer large, the working underneath. */
export function Answer({ main, working }: { main: ReactNode; working?: ReactNode }) {
	return (
		<div className="rounded-md bg-glass-50 px-4 py-3" data-testid="answer">
			<div className="text-lg font-semibold text-glass-900">{main}</div>
			{working && <div className="mt-2 space-y-1 text-sm text-ink-700">{working}</div>}
		</div>
	);
}

export function useFields<T extends Record<string, string>>(initial: T) {
	const [values, setValues] = useState(initial);
	const bind = (name: keyof T & string) => ({
		name,
		value: values[name],
		onChange: (v: string) => setValues((s) => ({ ...s, [name]: v })),
	});
	return { values, bind, setValues };
}
