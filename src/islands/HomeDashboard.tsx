import { useQuery } from '@tanstack/react-query';
import { QueryRoot } from './QueryRoot.tsx';
import { api } from '../lib/client/api.ts';
import type { HomeSummary } from '../lib/home/schema.ts';
import { LABELS } from '../lib/specimen/vocabulary.ts';
import { ROLE_LABELS, type Role } from '../lib/auth/roles.ts';
import type { CheckView } from '../lib/check/view.ts';
import { CHECK_LABELS } from '../lib/check/vocabulary.ts';
import { GradeBadge } from './check/GradeBadge.tsx';
import { Breakdown, Empty, Figure, Section } from './dashboard/parts.tsx';
import { MyTreatments, ReviewQueue } from './dashboard/ReviewQueue.tsx';

/** The home page's figures, fetched from /api/home; each role sees its own part. */
export default function HomeDashboard() {
	return (
		<QueryRoot>
			<Dashboard />
		</QueryRoot>
	);
}

function Dashboard() {
	const q = useQuery({ queryKey: ['home'], queryFn: () => api<HomeSummary>('/api/home') });
	if (q.isPending) return <p className="text-ink-600" role="status">Loading your overview…</p>;
	if (q.isError) return <p className="notice-error" role="alert">The overview could not be loaded: {q.error.message}</p>;
	const h = q.data;
	return (
		<div className="space-y-8" data-testid={`home-${h.role}`}>
			{h.openChecks !== null && (
				<Section title="My open condition checks">
					<CheckList
						view="mine"
						empty="You have no open condition checks. When a jar is due or flagged, open a check from its record in the register; it waits here until you submit it for review."
					/>
				</Section>
			)}
			{h.openChecks !== null && h.role === 'conservator' && (
				<Section title="My open treatments">
					<MyTreatments />
				</Section>
			)}
			{h.awaitingReview !== null && (
				<Section title="Waiting for review">
					<ReviewQueue />
				</Section>
			)}
			{h.collection && <Collection c={h.collection} />}
			{h.admin && <Admin a={h.admin} />}
		</div>
	);
}

function CheckList({ view, empty }: { view: 'mine'; empty: string }) {
	const q = useQuery({ queryKey: ['checks', view], queryFn: () => api<{ checks: CheckView[] }>(`/api/checks?view=${view}`) });
	if (q.isPending) return <p role="status">Loading…</p>;
	if (q.isError) return <p className="notice-error" role="alert">{q.error.message}</p>;
	if (q.data.checks.length === 0) return <Empty>{empty}</Empty>;
	return (
		<ul className="divide-y divide-ink-100" data-testid={`checks-${view}`}>
			{q.data.checks.map((c) => (
				<li key={c.id} className="flex flex-wrap items-center gap-3 py-2">
					<a className="font-mono font-semibold text-glass-700 underline" href={`/checks/${c.id}`}>{c.specimen.objectNumber}</a>
					<span>{c.specimen.title}</span>
					<GradeBadge grade={c.overallGrade} />
					<span className="ml-auto text-sm text-ink-700">
						{CHECK_LABELS.state[c.state]}
						{` · checked ${c.checkedOn}`}
					</span>
				</li>
			))}
		</ul>
	);
}

function Collection({ c }: { c: NonNullable<HomeSummary['collection']> }) {
	if (c.specimens === 0) {
		return (
			<Section title="The collection">
				<Empty>No specimens are registered yet. Register the first jar, or import the collection’s spreadsheet.</Empty>
			</Section>
		);
	}
	return (
		<Section title="The collection">
			<div className="grid grid-cols-2 gap-3 md:grid-cols-4">
				<Figure label="Specimens" value={c.specimens} />
				<Figure label="Checks overdue" value={c.overdue} tone={c.overdue > 0 ? 'alert' : undefined} />
				<Figure label="Due in the next 90 days" value={c.dueIn90Days} />
				<Figure label="With toxic or unknown hazards" value={c.withHazards} tone={c.withHazards > 0 ? 'caution' : undefined} />
			</div>
			<div className="mt-6 grid gap-6 md:grid-cols-3">
				<Breakdown title="By preservative" rows={rowsOf(c.byPreservative, LABELS.preservative)} of={c.specimens} />
				<Breakdown title="By seal" rows={rowsOf(c.bySeal, LABELS.seal)} of={c.specimens} />
				<Breakdown title="Hazard flags" rows={rowsOf(c.byHazard, LABELS.hazard)} of={c.specimens} />
			</div>
			{Object.keys(c.byHazard).length > 0 && (
				<p className="notice-caution mt-6">
					Jars flagged here may hold flammable spirit, formaldehyde, unknown fluids or seals and lids with lead, arsenic,
					mercury or coal-tar pitch. Handle them only under your organisation’s risk assessment and local regulations, with
					the controls they require; Meniscus records hazards but gives no safety advice of its own.
				</p>
			)}
			{c.mostOverdue.length > 0 && (
				<div className="mt-6">
					<h3 className="text-lg font-semibold">Most overdue</h3>
					<table className="mt-2 w-full text-left text-sm">
						<thead className="text-ink-600">
							<tr>
								<th className="py-2 pr-4 font-semibold">Object number</th>
								<th className="py-2 pr-4 font-semibold">Specimen</th>
								<th className="py-2 pr-4 font-semibold">Location</th>
								<th className="py-2 font-semibold">Check was due</th>
							</tr>
						</thead>
						<tbody>
							{c.mostOverdue.map((s) => (
								<tr key={s.id} className="border-t border-ink-100">
									<td className="py-2 pr-4 font-mono">
										<a className="text-glass-700 underline" href={`/specimens/${s.id}`}>{s.objectNumber}</a>
									</td>
									<td className="py-2 pr-4">{s.title}</td>
									<td className="py-2 pr-4">{s.location ?? '—'}</td>
									<td className="py-2">{s.nextCheckDue}</td>
								</tr>
							))}
						</tbody>
					</table>
				</div>
			)}
		</Section>
	);
}

function Admin({ a }: { a: NonNullable<HomeSummary['admin']> }) {
	return (
		<Section title="Accounts and mail">
			<div className="grid grid-cols-2 gap-3 md:grid-cols-4">
				{(Object.keys(ROLE_LABELS) as Role[]).map((r) => (
					<Figure key={r} label={`${ROLE_LABELS[r]}s`} value={a.usersByRole[r] ?? 0} />
				))}
				<Figure label="Invitations not yet taken up" value={a.pendingInvitations} />
				<Figure label="Disabled accounts" value={a.disabledUsers} />
				<Figure label="E-mails waiting to go" value={a.mailQueued} />
				<Figure label="E-mails that failed" value={a.mailFailed} tone={a.mailFailed > 0 ? 'alert' : undefined} />
			</div>
			<p className="mt-4 text-sm">
				<a className="font-semibold text-glass-700 underline" href="/admin/users">Manage users and roles</a>
			</p>
		</Section>
	);
}

const rowsOf = (counts: Record<string, number>, labels: Record<string, string>) =>
	Object.entries(counts).map(([key, count]) => ({ key, label: labels[key] ?? key, count }));
