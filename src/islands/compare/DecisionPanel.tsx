import { useState } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, ApiError } from '../../lib/client/api.ts';
import type { SourcePhoto } from './types.ts';

/** A reviewer's decision on the later photograph's check, taken where the evidence is. */
export function DecisionPanel({ photo, userId }: { photo: SourcePhoto; userId: string }) {
	const check = photo.check!;
	const qc = useQueryClient();
	const [comment, setComment] = useState('');
	const [done, setDone] = useState<string | null>(null);
	const review = useMutation({
		mutationFn: (decision: 'approve' | 'return') => api(`/api/checks/${check.id}/review`, { method: 'POST', body: { decision, comment } }),
		onSuccess: (_d, decision) => {
			setDone(decision === 'approve' ? 'Approved.' : 'Returned to the conservator.');
			void qc.invalidateQueries({ queryKey: ['comparison-sources'] });
		},
	});
	if (check.examinerId === userId) return <p className="text-sm text-ink-600">This check is yours: another reviewer decides on it.</p>;
	return (
		<section className="card space-y-2" aria-labelledby="decision-heading" data-testid="decision">
			<h2 id="decision-heading" className="text-lg">Decision on the check of {check.checkedOn}</h2>
			<p className="text-sm text-ink-600">By {check.examinerName}; in review. The comparison is saved with your decision if you save it.</p>
			{done ? (
				<p className="notice-info" role="status">
					{done}
				</p>
			) : (
				<>
					<label className="block text-sm">
						<span className="font-semibold">Comment</span>
						<textarea className="field-input mt-1 w-full" rows={3} value={comment} onChange={(e) => setComment(e.target.value)} />
					</label>
					{review.error && <p className="notice-error">{review.error instanceof ApiError ? review.error.message : 'The decision was not recorded.'}</p>}
					<div className="flex gap-2">
						<button type="button" className="btn-primary" disabled={review.isPending} onClick={() => review.mutate('approve')}>
							Approve the check
						</button>
						<button type="button" className="btn-secondary" disabled={review.isPending} onClick={() => review.mutate('return')}>
							Return with comment
						</button>
					</div>
				</>
			)}
		</section>
	);
}
