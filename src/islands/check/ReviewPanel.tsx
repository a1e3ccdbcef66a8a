import { useState } from 'react';
import type { CheckView } from '../../lib/check/view.ts';

/** A reviewer's decision on a check in review: approve, or return it saying what to change. */
export function ReviewPanel(props: { check: CheckView; onDecide: (decision: 'approve' | 'return', comment: string) => void; pending: boolean }) {
	const [comment, setComment] = useState('');
	return (
		<section className="card space-y-3" aria-labelledby="review-h" data-testid="review">
			<h2 id="review-h" className="text-xl font-semibold">Your review</h2>
			<p className="text-sm text-ink-700">
				Submitted by {props.check.examiner.name} on {props.check.submittedAt?.slice(0, 10)}. Approving makes this check part of the specimen’s permanent record; it cannot be changed afterwards.
			</p>
			<label className="field-label" htmlFor="review-comment">Comment (needed to return the check)</label>
			<textarea id="review-comment" className="field-input min-h-[5rem] py-2" value={comment} onChange={(e) => setComment(e.target.value)} />
			<div className="flex flex-wrap gap-3">
				<button type="button" className="btn-primary" disabled={props.pending} onClick={() => props.onDecide('approve', comment)}>
					Approve
				</button>
				<button type="button" className="btn-secondary" disabled={props.pending || comment.trim().length < 5} onClick={() => props.onDecide('return', comment)}>
					Return with comment
				</button>
			</div>
		</section>
	);
}
