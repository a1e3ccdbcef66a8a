import { useQuery } from '@tanstack/react-query';
import { api } from '../../lib/client/api.ts';
import type { CheckView } from '../../lib/check/view.ts';
import { CHECK_LABELS, type Grade } from '../../lib/check/vocabulary.ts';
import type { TreatmentSummary } from '../../lib/treatment/view.ts';
import { BAND_LABELS, type Band } from '../../lib/treatment/risk.ts';
import { GradeBadge } from '../check/GradeBadge.tsx';
import { Empty } from './parts.tsx';

type Previous = Record<string, { checkedOn: string; overallGrade: string | null }>;
type Item =
	| { kind: 'check'; since: string; check: CheckView; previous: Previous[string] | undefined }
	| { kind: 'risk'; since: string; t: TreatmentSummary };

/**
 * The reviewer's queue: condition checks and risk assessments waiting, in one list, oldest first,
 * each with what changed: a check's grade against the specimen's previous approved check, a risk
 * assessment's hazards and worst residual rating.
 */
export function ReviewQueue() {
	const checks = useQuery({ queryKey: ['checks', 'queue'], queryFn: () => api<{ checks: CheckView[]; previous: Previous }>('/api/checks?view=queue') });
	const risks = useQuery({ queryKey: ['treatments', 'queue'], queryFn: () => api<{ treatments: TreatmentSummary[] }>('/api/treatments?view=queue') });
	const failed = checks.error ?? risks.error;
	if (failed) return <p className="notice-error" role="alert">{failed.message}</p>;
	if (!checks.data || !risks.data) return <p role="status">Loading…</p>;
	const items: Item[] = [
		...checks.data.checks.map((c): Item => ({ kind: 'check', since: c.submittedAt ?? c.updatedAt, check: c, previous: checks.data.previous[c.id] })),
		...risks.data.treatments.map((t): Item => ({ kind: 'risk', since: t.riskSubmittedAt ?? t.updatedAt, t })),
	].sort((a, b) => a.since.localeCompare(b.since));
	if (items.length === 0) return <Empty>Nothing is waiting for your review. Checks and risk assessments that conservators submit queue here, oldest first.</Empty>;
	return (
		<ul className="divide-y divide-ink-100" data-testid="review-queue">
			{items.map((i) =>
				i.kind === 'check' ? (
					<li key={i.check.id} className="flex flex-wrap items-center gap-3 py-2" data-testid="queue-check">
						<span className="rounded bg-glass-100 px-2 py-0.5 text-xs font-semibold text-glass-900">Check</span>
						<a className="font-mono font-semibold text-glass-700 underline" href={`/checks/${i.check.id}`}>{i.check.specimen.objectNumber}</a>
						<span>{i.check.specimen.title}</span>
						<span className="flex items-center gap-1 text-sm">
							{i.previous ? (
								<>
									<GradeBadge grade={i.previous.overallGrade as Grade | null} /> → <GradeBadge grade={i.check.overallGrade} />
									<span className="text-ink-600">(last approved {i.previous.checkedOn})</span>
								</>
							) : (
								<>
									<GradeBadge grade={i.check.overallGrade} /> <span className="text-ink-600">first approved check</span>
								</>
							)}
						</span>
						<span className="ml-auto text-sm text-ink-700">
							{CHECK_LABELS.reason[i.check.reason]} · since {i.since.slice(0, 10)} · {i.check.examiner.name}
						</span>
					</li>
				) : (
					<li key={i.t.id} className="flex flex-wrap items-center gap-3 py-2" data-testid="queue-risk">
						<span className="rounded bg-spirit-100 px-2 py-0.5 text-xs font-semibold text-spirit-900">Risk assessment</span>
						<a className="font-mono font-semibold text-glass-700 underline" href={`/treatments/${i.t.id}`}>{i.t.specimen.objectNumber}</a>
						<span>{i.t.title}</span>
						<span className="text-sm text-ink-700">
							{i.t.hazards} {i.t.hazards === 1 ? 'hazard' : 'hazards'}
							{i.t.worstResidual ? `, worst residual ${BAND_LABELS[i.t.worstResidual as Band].toLowerCase()}` : ''}
						</span>
						<span className="ml-auto text-sm text-ink-700">since {i.since.slice(0, 10)} · {i.t.author.name}</span>
					</li>
				),
			)}
		</ul>
	);
}

/** A conservator's treatments still open. */
export function MyTreatments() {
	const q = useQuery({ queryKey: ['treatments', 'mine'], queryFn: () => api<{ treatments: TreatmentSummary[] }>('/api/treatments?view=mine') });
	if (q.error) return <p className="notice-error" role="alert">{q.error.message}</p>;
	if (!q.data) return <p role="status">Loading…</p>;
	if (q.data.treatments.length === 0) return <Empty>No open treatments. Plan one from a specimen’s page.</Empty>;
	return (
		<ul className="divide-y divide-ink-100 text-sm" data-testid="my-treatments">
			{q.data.treatments.map((t) => (
				<li key={t.id} className="flex flex-wrap items-center gap-3 py-2">
					<a className="font-mono font-semibold text-glass-700 underline" href={`/treatments/${t.id}`}>{t.specimen.objectNumber}</a>
					<span>{t.title}</span>
					<span className="ml-auto text-ink-700">{t.riskState === 'signed-off' ? 'Signed off: work may proceed' : t.riskState === 'in-review' ? 'Waiting for sign-off' : t.riskState === 'returned' ? 'Risk assessment returned' : 'Risk assessment being written'}</span>
				</li>
			))}
		</ul>
	);
}
