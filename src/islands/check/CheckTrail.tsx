import { useQuery } from '@tanstack/react-query';
import { api } from '../../lib/client/api.ts';
import type { HistoryEntry } from '../../lib/specimen/view.ts';

/** What happened to a check, newest first (from the audit trail). */
const WHAT: Record<string, string> = {
	'check.open': 'opened the check',
	'check.save': 'saved',
	'check.submit': 'submitted it for review',
	'check.return': 'returned it',
	'check.approve': 'approved it',
};

export function CheckTrail({ id, version }: { id: string; version: number }) {
	const q = useQuery({ queryKey: ['check-history', id, version], queryFn: () => api<{ history: HistoryEntry[] }>(`/api/checks/${id}/history`) });
	if (!q.data?.history.length) return null;
	return (
		<section className="card" aria-labelledby="trail-h">
			<h2 id="trail-h" className="text-xl font-semibold">What happened to this check</h2>
			<ol className="mt-3 space-y-1 text-sm" data-testid="check-trail">
				{q.data.history.map((e) => (
					<li key={e.id}>
						<time dateTime={e.at}>{new Date(e.at).toLocaleString('en-GB')}</time> · {e.actor ?? 'system'} {WHAT[e.action] ?? e.action}
					</li>
				))}
			</ol>
		</section>
	);
}
