import { useMutation, useQuery } from '@tanstack/react-query';
import { api, ApiError } from '../../lib/client/api.ts';
import type { CheckView } from '../../lib/check/view.ts';
import { CHECK_LABELS, PARTS } from '../../lib/check/vocabulary.ts';
import { GradeBadge } from '../check/GradeBadge.tsx';
import { checkExportUrl } from '../../lib/check/exportQuery.ts';

/**
 * Every condition check of a specimen, newest first, each with what changed since the approved check
 * before it: part grades, fluid level and real strength. Conservators open a new check here.
 */
export function CheckHistory({ specimenId, canOpen }: { specimenId: string; canOpen: boolean }) {
	const q = useQuery({ queryKey: ['checks', specimenId], queryFn: () => api<{ checks: CheckView[] }>(`/api/specimens/${specimenId}/checks`) });
	const open = useMutation<{ check: CheckView }, ApiError>({
		mutationFn: () => api(`/api/specimens/${specimenId}/checks`, { method: 'POST', body: {} }),
		onSuccess: (r) => window.location.assign(`/checks/${r.check.id}`),
	});
	const checks = q.data?.checks ?? [];
	return (
		<section className="card" aria-labelledby="checks-h">
			<div className="flex flex-wrap items-center justify-between gap-3">
				<h2 id="checks-h" className="text-xl font-semibold">Condition checks</h2>
				<a className="ml-auto text-sm text-glass-700 underline" href={checkExportUrl({ specimen: specimenId })} download>
					Export checks (CSV)
				</a>
				{canOpen && (
					<button type="button" className="btn-primary" disabled={open.isPending} onClick={() => open.mutate()}>
						Open a condition check
					</button>
				)}
			</div>
			{open.error && <p className="notice-error mt-3" role="alert">{open.error.message}</p>}
			{q.isPending && <p role="status">Loading…</p>}
			{q.isSuccess && checks.length === 0 && <p className="mt-3 rounded-md border border-dashed border-ink-200 bg-paper px-4 py-6">No condition check yet.</p>}
			<ol className="mt-3 space-y-3" data-testid="checks">
				{checks.map((c, i) => (
					<li key={c.id} className="rounded-md border border-ink-100 p-3">
						<div className="flex flex-wrap items-center gap-3">
							<a className="font-semibold text-glass-700 underline" href={`/checks/${c.id}`}>{c.checkedOn}</a>
							<span className="text-sm">{CHECK_LABELS.reason[c.reason]}</span>
							<GradeBadge grade={c.overallGrade} />
							{c.priority && <span className="text-sm">Priority: {CHECK_LABELS.priority[c.priority]}</span>}
							<span className="ml-auto rounded bg-ink-50 px-2 py-0.5 text-xs font-semibold">{CHECK_LABELS.state[c.state]}</span>
						</div>
						<Changes check={c} previous={checks.slice(i + 1).find((p) => p.state === 'approved')} />
					</li>
				))}
			</ol>
		</section>
	);
}

function Changes({ check, previous }: { check: CheckView; previous?: CheckView }) {
	const lines: string[] = [];
	const f = check.fluid;
	if (f?.levelMm !== null && f?.levelMm !== undefined) lines.push(`Fluid level ${f.levelMm} mm`);
	if (f?.realPercentVol !== null && f?.realPercentVol !== undefined) lines.push(`strength ${f.realPercentVol.toFixed(1)} % vol`);
	if (previous) {
		for (const p of PARTS) {
			const [a, b] = [previous.parts[p].grade, check.parts[p].grade];
			if (a && b && a !== b) lines.push(`${CHECK_LABELS.part[p]} ${CHECK_LABELS.grade[a].toLowerCase()} → ${CHECK_LABELS.grade[b].toLowerCase()}`);
		}
		const pl = previous.fluid?.levelMm;
		if (pl !== null && pl !== undefined && f?.levelMm !== null && f?.levelMm !== undefined) {
			const d = f.levelMm - pl;
			lines.push(`level ${d > 0 ? '+' : d < 0 ? '−' : '±'}${Math.abs(d).toFixed(1)} mm since ${previous.checkedOn}`);
		}
	}
	return lines.length ? <p className="mt-2 text-sm text-ink-700">{lines.join(' · ')}</p> : null;
}
