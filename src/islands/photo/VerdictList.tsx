import type { Verdict } from './useUploadVerdicts.ts';

/** What the server made of each upload: waiting, recorded, or refused with the reason. */
export function VerdictList({ verdicts }: { verdicts: Verdict[] }) {
	if (verdicts.length === 0) return null;
	return (
		<ul className="space-y-1 text-sm" aria-label="What the server made of each upload" aria-live="polite">
			{verdicts.map((v) => (
				<li key={v.id} className={v.state === 'refused' || v.state === 'quarantined' ? 'notice-error' : 'notice-info'}>
					<span className="font-semibold">{v.fileName}</span>: {v.label}
					{v.reason ? ` — ${v.reason}` : ''}
				</li>
			))}
		</ul>
	);
}
