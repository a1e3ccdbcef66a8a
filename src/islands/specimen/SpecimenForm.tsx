import { useMutation, useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { useForm, type Path, type UseFormRegister } from 'react-hook-form';
import { QueryRoot } from '../QueryRoot.tsx';
import { api, ApiError } from '../../lib/client/api.ts';
import { SpecimenSchema } from '../../lib/specimen/schema.ts';
import type { SpecimenView } from '../../lib/specimen/view.ts';
import { CLOSURE_TYPES, CONTAINER_MATERIALS, CONTAINER_SHAPES, HAZARD_FLAGS, LABELS, PRESERVATIVE_KINDS, SEAL_TYPES } from '../../lib/specimen/vocabulary.ts';
import { emptyForm, fromView, toInput, type FormValues } from './formValues.ts';
import { ConflictNotice } from './ConflictNotice.tsx';

/**
 * Registering or editing a specimen (react-hook-form for the state, the shared zod schema for the
 * rules, so the form and the API refuse the same things). An edit carries the version it started
 * from; if someone saved in between, the form keeps what was typed and shows what they changed.
 */
export default function SpecimenForm({ id }: { id?: string }) {
	return (
		<QueryRoot>
			<Loader id={id} />
		</QueryRoot>
	);
}

type Location = { id: string; code: string; name: string };

/** Loads the record (when editing) and the locations before the form mounts, so every select starts on its saved value. */
function Loader({ id }: { id?: string }) {
	const locations = useQuery({ queryKey: ['locations'], queryFn: () => api<{ locations: Location[] }>('/api/locations') });
	const record = useQuery({
		queryKey: ['specimen', id],
		queryFn: () => api<{ specimen: SpecimenView }>(`/api/specimens/${id}`),
		enabled: !!id,
	});
	const failed = locations.error ?? record.error;
	if (failed) return <p className="notice-error" role="alert">{failed.message}</p>;
	if (!locations.data || (id && !record.data)) return <p role="status">Loading…</p>;
	const specimen = record.data?.specimen;
	return <Form initial={specimen ? fromView(specimen) : emptyForm()} original={specimen} locations={locations.data.locations} />;
}

type SaveResult = { specimen: SpecimenView };

function Form({ initial, original, locations }: { initial: FormValues; original?: SpecimenView; locations: Location[] }) {
	const { register, handleSubmit, watch, setError, formState } = useForm<FormValues>({ defaultValues: initial });
	const [base, setBase] = useState(original);
	const [conflict, setConflict] = useState<SpecimenView | null>(null);
	const shape = watch('containerShape');
	const save = useMutation<SaveResult, ApiError, FormValues>({
		mutationFn: (v) =>
			base
				? api<SaveResult>(`/api/specimens/${base.id}`, { method: 'PUT', body: { version: base.version, record: toInput(v) } })
				: api<SaveResult>('/api/specimens', { method: 'POST', body: toInput(v) }),
		onSuccess: (r) => window.location.assign(`/specimens/${r.specimen.id}?saved=1`),
		onError: (e) => {
			const current = (e.body as { current?: SpecimenView } | null)?.current;
			if (e.status === 409 && current) setConflict(current);
			for (const f of e.fields) setError(f.path as Path<FormValues>, { message: f.message });
		},
	});
	useEffect(() => {
		if (formState.submitCount > 0 && Object.keys(formState.errors).length > 0) {
			document.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
		}
	}, [formState.submitCount, formState.errors]);

	const submit = handleSubmit((v) => {
		const parsed = SpecimenSchema.safeParse(toInput(v));
		if (!parsed.success) {
			for (const i of parsed.error.issues) setError(i.path.join('.') as Path<FormValues>, { message: i.message });
			return;
		}
		save.mutate(v);
	});
	const err = (name: string) => (formState.errors as Record<string, { message?: string }>)[name]?.message;
	const field = { register, err };
	const [w, d] = shape === 'cylinder' ? ['Inner diameter'] : shape === 'oval' ? ['Major axis (inside)', 'Minor axis (inside)'] : ['Inner width', 'Inner depth'];

	return (
		<form className="space-y-6" onSubmit={submit} noValidate>
			{conflict && base && (
				<ConflictNotice
					original={base}
					current={conflict}
					onKeepMine={() => {
						setBase(conflict);
						setConflict(null);
					}}
				/>
			)}
			<fieldset className="card grid gap-4 sm:grid-cols-2">
				<legend className="px-1 font-serif text-lg font-semibold">The specimen</legend>
				<Text {...field} name="objectNumber" label="Object number" hint="The museum’s own number, e.g. STC.1898.014" />
				<Text {...field} name="title" label="Title" />
				<Text {...field} name="department" label="Collection or department" />
				<LocationSelect register={register} locations={locations} />
				<div className="sm:col-span-2">
					<label className="field-label" htmlFor="f-description">Description</label>
					<textarea id="f-description" className="field-input min-h-[6rem] py-2" {...register('description')} />
				</div>
			</fieldset>
			<fieldset className="card grid gap-4 sm:grid-cols-3">
				<legend className="px-1 font-serif text-lg font-semibold">Container</legend>
				<Select {...field} name="containerShape" label="Shape" options={CONTAINER_SHAPES.map((k) => [k, LABELS.shape[k]])} />
				<Select {...field} name="containerMaterial" label="Material" options={CONTAINER_MATERIALS.map((k) => [k, LABELS.material[k]])} />
				<Select {...field} name="closureType" label="Closure" options={CLOSURE_TYPES.map((k) => [k, LABELS.closure[k]])} />
				<Text {...field} name="innerWidthMm" label={`${w} (mm)`} inputMode="decimal" />
				{d && <Text {...field} name="innerDepthMm" label={`${d} (mm)`} inputMode="decimal" />}
				<Text {...field} name="innerHeightMm" label="Inner height to the lid (mm)" inputMode="decimal" />
				<Select {...field} name="sealType" label="Seal" options={SEAL_TYPES.map((k) => [k, LABELS.seal[k]])} />
			</fieldset>
			<fieldset className="card grid gap-4 sm:grid-cols-2">
				<legend className="px-1 font-serif text-lg font-semibold">Fluid</legend>
				<Select {...field} name="preservativeKind" label="Preservative" options={PRESERVATIVE_KINDS.map((k) => [k, LABELS.preservative[k]])} />
				<Text {...field} name="preservativeRecorded" label="As recorded (label, old register)" hint="Keep the old wording, e.g. “spirit (label, 1898)”" />
				<Text {...field} name="specimenTopMm" label="Top of the specimen (mm above the inner base)" inputMode="decimal" hint="Measured like the fluid level; the history forecasts when the fluid would fall to it." />
			</fieldset>
			<fieldset className="card space-y-3">
				<legend className="px-1 font-serif text-lg font-semibold">Hazards</legend>
				<p className="text-sm text-ink-700">Flag what the jar may hold or be made of; add a note on what is known. An unknown fluid is presumed toxic and flammable.</p>
				<div className="grid gap-3 sm:grid-cols-2">
					{HAZARD_FLAGS.map((f) => (
						<div key={f} className="rounded-md border border-ink-100 p-3">
							<label className="flex min-h-touch items-center gap-2 font-semibold">
								<input type="checkbox" className="h-5 w-5" {...register(`hazards.${f}.on`)} />
								{LABELS.hazard[f]}
							</label>
							<label className="sr-only" htmlFor={`f-hz-${f}`}>Note on {LABELS.hazard[f]}</label>
							<input id={`f-hz-${f}`} className="field-input" placeholder="Note (optional)" maxLength={500} {...register(`hazards.${f}.note`)} />
						</div>
					))}
				</div>
				{err('hazards') && <p className="field-error">{err('hazards')}</p>}
			</fieldset>
			<fieldset className="card grid gap-4 sm:grid-cols-2">
				<legend className="px-1 font-serif text-lg font-semibold">Next check</legend>
				<Text {...field} name="nextCheckDue" label="Next check due" type="date" hint="Set here for now; condition checks will compute it from the grade." />
			</fieldset>
			{save.error && !conflict && <p className="notice-error" role="alert">{save.error.message}</p>}
			<div className="flex gap-3">
				<button className="btn-primary" type="submit" disabled={save.isPending}>
					{save.isPending ? 'Saving…' : base ? 'Save changes' : 'Register the specimen'}
				</button>
				<a className="btn-secondary" href={base ? `/specimens/${base.id}` : '/specimens'}>Cancel</a>
			</div>
		</form>
	);
}

interface FieldProps {
	register: UseFormRegister<FormValues>;
	err: (name: string) => string | undefined;
	name: Path<FormValues>;
	label: string;
	hint?: string;
}

function Text({ register, err, name, label, hint, type = 'text', inputMode }: FieldProps & { type?: string; inputMode?: 'decimal' }) {
	const id = `f-${name}`;
	const e = err(name);
	return (
		<div>
			<label className="field-label" htmlFor={id}>{label}</label>
			<input id={id} type={type} inputMode={inputMode} className="field-input" aria-invalid={e ? true : undefined} aria-describedby={`${id}-note`} {...register(name)} />
			<p id={`${id}-note`} className={e ? 'field-error' : 'mt-1 text-xs text-ink-600'}>{e ?? hint}</p>
		</div>
	);
}

function Select({ register, err, name, label, options }: FieldProps & { options: [string, string][] }) {
	const id = `f-${name}`;
	return (
		<div>
			<label className="field-label" htmlFor={id}>{label}</label>
			<select id={id} className="field-input" {...register(name)}>
				{options.map(([v, l]) => (
					<option key={v} value={v}>{l}</option>
				))}
			</select>
			{err(name) && <p className="field-error">{err(name)}</p>}
		</div>
	);
}

function LocationSelect({ register, locations }: { register: UseFormRegister<FormValues>; locations: Location[] }) {
	return (
		<div>
			<label className="field-label" htmlFor="f-storageLocationId">Storage location</label>
			<select id="f-storageLocationId" className="field-input" {...register('storageLocationId')}>
				<option value="">Not recorded</option>
				{locations.map((l) => (
					<option key={l.id} value={l.id}>{l.code} — {l.name}</option>
				))}
			</select>
		</div>
	);
}
