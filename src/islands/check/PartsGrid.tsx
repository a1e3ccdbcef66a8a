import { CHECK_LABELS, GRADES, PARTS, type Grade, type Part } from '../../lib/check/vocabulary.ts';
import { GRADE_STYLE } from './GradeBadge.tsx';

/** One row per part: a grade (four buttons, words always shown), damage terms and a note. */
export type PartsValue = Record<Part, { grade: Grade | null; terms: string[]; note: string }>;

type Msg = { message?: string } | undefined;
export type PartErrors = Partial<Record<Part, { grade?: Msg; terms?: Msg; note?: Msg }>>;

export function PartsGrid(props: { value: PartsValue; onChange: (v: PartsValue) => void; terms: Record<Part, string[]>; readOnly: boolean; errors?: PartErrors }) {
	const set = (part: Part, change: Partial<PartsValue[Part]>) => props.onChange({ ...props.value, [part]: { ...props.value[part], ...change } });
	return (
		<div className="divide-y divide-ink-100">
			{PARTS.map((part) => {
				const v = props.value[part];
				return (
					<fieldset key={part} className="grid gap-3 py-4 md:grid-cols-[9rem_1fr]" data-testid={`part-${part}`}>
						<legend className="sr-only">{CHECK_LABELS.part[part]}</legend>
						<div className="font-semibold" aria-hidden="true">{CHECK_LABELS.part[part]}</div>
						<div className="space-y-3">
							<div className="flex flex-wrap gap-2" role="radiogroup" aria-label={`Grade of the ${CHECK_LABELS.part[part].toLowerCase()}`}>
								{GRADES.map((g) => (
									<button
										key={g}
										type="button"
										role="radio"
										aria-checked={v.grade === g}
										disabled={props.readOnly}
										title={CHECK_LABELS.gradeMeaning[g]}
										onClick={() => set(part, { grade: v.grade === g ? null : g })}
										className={`min-h-touch rounded-md border px-3 text-sm font-semibold ${v.grade === g ? GRADE_STYLE[g].className + ' ring-2 ring-offset-1 ring-current' : 'border-ink-200 bg-white text-ink-700'}`}
									>
										{CHECK_LABELS.grade[g]}
									</button>
								))}
								{v.grade === null && <span className="self-center text-sm text-ink-600">not graded</span>}
							</div>
							<div className="flex flex-wrap gap-2" aria-label={`Damage seen on the ${CHECK_LABELS.part[part].toLowerCase()}`} role="group">
								{props.terms[part].map((t) => {
									const on = v.terms.includes(t);
									return (
										<label key={t} className={`inline-flex min-h-[2.25rem] items-center gap-1.5 rounded-full border px-3 text-sm ${on ? 'border-glass-700 bg-glass-50 text-glass-900' : 'border-ink-200 text-ink-700'}`}>
											<input
												type="checkbox"
												className="h-4 w-4"
												checked={on}
												disabled={props.readOnly}
												onChange={() => set(part, { terms: on ? v.terms.filter((x) => x !== t) : [...v.terms, t] })}
											/>
											{t}
										</label>
									);
								})}
							</div>
							<label className="sr-only" htmlFor={`note-${part}`}>Note on the {CHECK_LABELS.part[part].toLowerCase()}</label>
							<input
								id={`note-${part}`}
								className="field-input"
								placeholder="What you see, where, how much"
								maxLength={2000}
								value={v.note}
								readOnly={props.readOnly}
								onChange={(e) => set(part, { note: e.target.value })}
								aria-invalid={props.errors?.[part]?.note ? true : undefined}
							/>
							{[props.errors?.[part]?.grade, props.errors?.[part]?.terms, props.errors?.[part]?.note].map((m, i) =>
								m?.message ? <p key={i} className="field-error" role="alert">{m.message}</p> : null,
							)}
						</div>
					</fieldset>
				);
			})}
		</div>
	);
}
