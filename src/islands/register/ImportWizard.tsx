import { useMutation } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api, ApiError } from '../../lib/client/api.ts';
import type { ImportMapping, ImportPreview, ImportResult } from '../../lib/specimen/csvImport.ts';
import { ChooseFile } from './import/ChooseFile.tsx';
import { MapColumns } from './import/MapColumns.tsx';
import { PreviewRows } from './import/PreviewRows.tsx';
import { ImportDone } from './import/ImportDone.tsx';

/**
 * Importing the register from a CSV file, in four steps: choose the file, say which column fills
 * which field, check every row, import. Nothing is saved before the last step, and the server
 * checks the whole file again then.
 */
export default function ImportWizard() {
	return (
		<QueryRoot>
			<Wizard />
		</QueryRoot>
	);
}

type Step = 'file' | 'map' | 'preview' | 'done';
const STEPS: [Step, string][] = [
	['file', 'Choose the file'],
	['map', 'Match the columns'],
	['preview', 'Check the rows'],
	['done', 'Imported'],
];

interface FileText {
	name: string;
	csv: string;
}

function Wizard() {
	const [step, setStepNow] = useState<Step>('file');
	const [moved, setMoved] = useState(false);
	const setStep = (s: Step) => {
		setMoved(true);
		setStepNow(s);
	};
	const [file, setFile] = useState<FileText | null>(null);
	const [mapping, setMapping] = useState<ImportMapping>({});
	const [preview, setPreview] = useState<ImportPreview | null>(null);
	const [result, setResult] = useState<ImportResult | null>(null);
	const check = useMutation<{ preview: ImportPreview }, ApiError, { csv: string; mapping?: ImportMapping }>({
		mutationFn: (body) => api('/api/specimens/import/preview', { method: 'POST', body }),
		onSuccess: (r) => setPreview(r.preview),
	});
	const commit = useMutation<{ result: ImportResult }, ApiError, { csv: string; mapping: ImportMapping }>({
		mutationFn: (body) => api('/api/specimens/import/commit', { method: 'POST', body }),
		onSuccess: (r) => {
			setResult(r.result);
			setStep('done');
		},
		// Refused because rows have errors now (the register may have changed since the preview): show them.
		onError: (e) => {
			const body = e.body as { preview?: ImportPreview } | null;
			if (e.status === 422 && body?.preview) setPreview(body.preview);
		},
	});

	function read(f: FileText) {
		setFile(f);
		commit.reset();
		// The server guesses the mapping from the column names; the person then checks it.
		check.mutate({ csv: f.csv }, {
			onSuccess: (r) => {
				setMapping(r.preview.mapping);
				setStep('map');
			},
		});
	}
	function restart() {
		setFile(null);
		setPreview(null);
		setResult(null);
		check.reset();
		commit.reset();
		setStep('file');
	}

	const title = STEPS.find(([s]) => s === step)![1];
	return (
		<div className="space-y-4">
			<ol className="flex flex-wrap gap-2 text-sm" aria-label="Steps">
				{STEPS.map(([s, label], i) => (
					<li
						key={s}
						aria-current={s === step ? 'step' : undefined}
						className={s === step ? 'rounded-md bg-glass-700 px-3 py-1 font-semibold text-white' : 'rounded-md bg-ink-50 px-3 py-1 text-ink-700'}
					>
						{i + 1}. {label}
					</li>
				))}
			</ol>
			<section className="card" aria-labelledby="import-step-h">
				<StepHeading key={step} focus={moved} text={file && step !== 'file' ? `${title}: ${file.name}` : title} />
				{step === 'file' && <ChooseFile busy={check.isPending} serverError={check.error} onRead={read} />}
				{step === 'map' && file && preview && (
					<MapColumns
						preview={preview}
						mapping={mapping}
						onChange={setMapping}
						busy={check.isPending}
						error={check.error}
						onBack={restart}
						onNext={() => check.mutate({ csv: file.csv, mapping }, { onSuccess: () => setStep('preview') })}
					/>
				)}
				{step === 'preview' && file && preview && (
					<PreviewRows
						preview={preview}
						committing={commit.isPending}
						error={commit.error}
						onBack={() => {
							commit.reset();
							setStep('map');
						}}
						onChooseAgain={restart}
						onCommit={() => commit.mutate({ csv: file.csv, mapping: preview.mapping })}
					/>
				)}
				{step === 'done' && result && <ImportDone result={result} onAgain={restart} />}
			</section>
		</div>
	);
}

/**
 * Each step's heading takes the focus when the step opens (the button that led there is gone), so
 * keyboard and screen-reader users start at the top of the new step. Not on page load, though.
 */
function StepHeading({ text, focus }: { text: string; focus: boolean }) {
	const ref = useRef<HTMLHeadingElement>(null);
	useEffect(() => {
		if (focus) ref.current?.focus();
	}, [focus]);
	return (
		<h2 id="import-step-h" ref={ref} tabIndex={-1} className="text-xl font-semibold outline-none">
			{text}
		</h2>
	);
}
