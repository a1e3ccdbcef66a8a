import { useState } from 'react';
import type { TreatmentView } from '../../lib/treatment/view.ts';

/** A reviewer's decision on a risk assessment: sign it off, or return it saying what to change. */
export function RiskReview(props: { t: TreatmentView; pending: boolean; onDecide: (decision: 'sign-off' | 'return', comment: string) => void }) {
	const [comment, setComment] = useState('');
	const blocked = props.t.riskProblems.length > 0;
	return (
		<div className="space-y-3 rounded-md border border-glass-300 bg-glass-50 p-4" data-testid="risk-review">
			<h3 className="font-semibold">Your sign-off</h3>
			<p className="text-sm text-ink-700">
				Asked for by {props.t.author.name} on {props.t.riskSubmittedAt?.slice(0, 10)}. Signing off lets the work steps start; it does not replace your organisation’s own assessment or local regulations.
			</p>
			{blocked && <p className="notice-error">{props.t.riskProblems[0]}</p>}
			<label className="field-label" htmlFor="risk-comment">Comment (needed to return the assessment)</label>
			<textarea id="risk-comment" className="field-input min-h-[4rem] py-2" value={comment} onChange={(e) => setComment(e.target.value)} />
			<div className="flex flex-wrap gap-3">
				<button type="button" className="btn-primary" disabled={props.pending || blocked} onClick={() => props.onDecide('sign-off', comment)}>Sign off</button>
				<button type="button" className="btn-secondary" disabled={props.pending || comment.trim().length < 5} onClick={() => props.onDecide('return', comment)}>Return with comment</button>
			</div>
		</div>
	);
}
