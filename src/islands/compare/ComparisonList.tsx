import { useQuery } from '@tanstack/react-query';
import { api } from '../../lib/client/api.ts';
import { CHANGE_CLASSES } from '../../lib/compare/changes.ts';
import { CHANGE_STYLE } from '../../lib/compare/changeStyle.ts';
import type { ComparisonListItem } from './types.ts';
import { QueryRoot } from '../QueryRoot.tsx';

/** On the specimen's page: the way into comparing its photographs, and the comparisons kept so far. */
export default function ComparisonList({ specimenId }: { specimenId: string }) {
	return (
		<QueryRoot>
			<List specimenId={specimenId} />
		</QueryRoot>
	);
}

function List({ specimenId }: { specimenId: string }) {
	const list = useQuery({ queryKey: ['comparisons', specimenId], queryFn: () => api<{ comparisons: ComparisonListItem[] }>(`/api/specimens/${specimenId}/comparisons`) });
	return (
		<section className="card space-y-3" aria-labelledby="comparisons-heading" data-testid="comparisons">
			<div className="flex flex-wrap items-center justify-between gap-2">
				<h2 id="comparisons-heading" className="text-lg">Comparisons</h2>
				<a className="btn-secondary" href={`/specimens/${specimenId}/compare`}>
					Compare two photographs
				</a>
			</div>
			{list.error && <p className="notice-error">{list.error.message}</p>}
			{list.data && list.data.comparisons.length === 0 && <p className="text-sm text-ink-600">None kept yet. Compare this check's photographs with the last check's to see what changed.</p>}
			{list.data && list.data.comparisons.length > 0 && (
				<ul className="divide-y divide-ink-100 text-sm">
					{list.data.comparisons.map((c) => (
						<li key={c.id} className="py-2">
							<a className="text-glass-700 underline" href={`/comparisons/${c.id}`}>
								{c.beforeDate ?? 'undated'} → {c.afterDate ?? 'undated'}
							</a>{' '}
							<span className="text-ink-600">
								· {c.model === 'none' ? 'unaligned' : `${c.model} fit`} ·{' '}
								{CHANGE_CLASSES.filter((k) => k !== 'unchanged' && c.counts[k] > 0)
									.map((k) => `${c.counts[k]} ${CHANGE_STYLE[k].label}`)
									.join(', ') || 'no change beyond the threshold'}{' '}
								· {c.createdBy.name}, {c.updatedAt.slice(0, 10)}
							</span>
						</li>
					))}
				</ul>
			)}
		</section>
	);
}
