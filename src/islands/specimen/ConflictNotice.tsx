import { changedFields } from '../../lib/specimen/diff.ts';
import { FIELD_LABELS, showValue } from '../../lib/specimen/fieldLabels.ts';
import type { SpecimenView } from '../../lib/specimen/view.ts';

/**
 * Shown when a save was refused because someone else saved first: what they changed (original →
 * now), and the choice to save this form over it or to start again from their version.
 */
export function ConflictNotice(props: { original: SpecimenView; current: SpecimenView; onKeepMine: () => void }) {
	const theirs = changedFields(props.original, props.current, ['version', 'updatedAt', 'createdAt']);
	return (
		<div className="notice-caution space-y-2" role="alert" data-testid="conflict">
			<p className="font-semibold">Someone else saved this record while you were editing it.</p>
			<p>Your changes are still in the form below. They changed:</p>
			<ul className="list-disc pl-5">
				{theirs.map((c) => (
					<li key={c.field}>
						{FIELD_LABELS[c.field] ?? c.field}: {showValue(c.before)} → <strong>{showValue(c.after)}</strong>
					</li>
				))}
			</ul>
			<div className="flex flex-wrap gap-2 pt-1">
				<button type="button" className="btn-primary" onClick={props.onKeepMine}>
					Review and save mine over theirs
				</button>
				<button type="button" className="btn-secondary" onClick={() => window.location.reload()}>
					Discard mine, load theirs
				</button>
			</div>
		</div>
	);
}
