import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { QueryRoot } from './QueryRoot.tsx';
import { api } from '../lib/client/api.ts';
import { MAIL_KIND_INFO, type MailKind, type MailPreferences, type MailPreferencesPatch } from '../lib/mail/preferences.ts';

type Answer = { preferences: MailPreferences };

/** One's own optional mail, one switch per kind; each change is saved at once. */
export default function MailSettings({ kinds }: { kinds: MailKind[] }) {
	return (
		<QueryRoot>
			<Switches kinds={kinds} />
		</QueryRoot>
	);
}

function Switches({ kinds }: { kinds: MailKind[] }) {
	const client = useQueryClient();
	const q = useQuery({ queryKey: ['mail-preferences'], queryFn: () => api<Answer>('/api/me/mail-preferences') });
	// The switch moves at once, in the click's own render: React puts a controlled checkbox back
	// when the click's state update comes later (TanStack's onMutate runs a tick after the click).
	// A refusal puts it back; the saved answer replaces the local value.
	const [shown, setShown] = useState<MailPreferencesPatch>({});
	const save = useMutation({
		mutationFn: (patch: MailPreferencesPatch) => api<Answer>('/api/me/mail-preferences', { method: 'PATCH', body: patch }),
		onSettled: (data, _err, patch) => {
			if (data) client.setQueryData(['mail-preferences'], data);
			setShown((now) => {
				const rest = { ...now };
				for (const k of Object.keys(patch) as MailKind[]) if (rest[k] === patch[k]) delete rest[k];
				return rest;
			});
		},
	});
	const toggle = (k: MailKind, on: boolean) => {
		setShown((now) => ({ ...now, [k]: on }));
		save.mutate({ [k]: on });
	};
	if (kinds.length === 0) return <p className="notice-info">Your role receives no optional mail.</p>;
	if (q.isPending) return <p role="status">Loading…</p>;
	if (q.isError) return <p className="notice-error" role="alert">{q.error.message}</p>;
	const prefs = q.data.preferences;
	return (
		<div className="max-w-prose">
			<fieldset className="card space-y-3">
				<legend className="sr-only">E-mail about condition checks</legend>
				{kinds.map((k) => (
					<label key={k} className="flex min-h-touch cursor-pointer items-start gap-3">
						<input
							type="checkbox"
							className="mt-1 h-5 w-5"
							name={k}
							checked={shown[k] ?? prefs[k]}
							onChange={(e) => toggle(k, e.currentTarget.checked)}
						/>
						<span>
							<span className="block font-semibold">{MAIL_KIND_INFO[k].label}</span>
							<span className="block text-sm text-ink-600">{MAIL_KIND_INFO[k].hint}</span>
						</span>
					</label>
				))}
			</fieldset>
			<p className="mt-3 min-h-6 text-sm" role="status" data-testid="mail-status">
				{save.isPending ? 'Saving…' : save.isError ? '' : save.isSuccess ? 'Saved.' : ''}
			</p>
			{save.isError && <p className="notice-error" role="alert">{save.error.message}</p>}
		</div>
	);
}
