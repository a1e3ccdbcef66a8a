import { useInfiniteQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { QueryRoot } from '../QueryRoot.tsx';
import { api } from '../../lib/client/api.ts';
import { describeDetail, SECURITY_KINDS, SECURITY_KIND_IDS, type SecurityEvent, type SecurityKind, type SecurityPage } from '../../lib/audit/security.ts';

/**
 * The security log for administrators: sign-ins and their failures, throttling, refused requests,
 * account changes and downloads, newest first, with the address each came from. Times show in the
 * reader's zone with UTC beside them; the download gives the same events as JSON Lines in UTC.
 */
export default function SecurityLog() {
	return (
		<QueryRoot>
			<Log />
		</QueryRoot>
	);
}

const ACTION_WORDS: Record<string, string> = {
	'sign-in': 'Signed in',
	'sign-in.failed': 'Sign-in failed',
	'sign-in.throttled': 'Sign-in held back (too many attempts)',
	'sign-out': 'Signed out',
	'password.reset-request': 'Asked for a password link',
	'password.reset-request-ignored': 'Password link asked for an unknown or disabled account',
	'password.set-by-reset': 'Set a new password (link)',
	'password.set-by-invite': 'Set a first password (invitation)',
	'access.refused': 'Refused: not allowed',
	'request.cross-site-refused': 'Refused: sent from another site',
	'user.first-admin': 'First administrator created',
	'user.create': 'Account created',
	'user.invite': 'Invitation sent again',
	'user.update': 'Account changed',
	'photo.original-downloaded': 'Original photograph downloaded',
	'check.report-downloaded': 'Condition report downloaded',
};

function queryString(kind: SecurityKind | 'all', since: string, address: string, extra: Record<string, string> = {}): string {
	const p = new URLSearchParams({ kind, ...extra });
	if (since) p.set('since', since);
	if (address.trim()) p.set('address', address.trim());
	return p.toString();
}

function Log() {
	const [kind, setKind] = useState<SecurityKind | 'all'>('all');
	const [since, setSince] = useState('');
	const [address, setAddress] = useState('');
	const qs = queryString(kind, since, address);
	const q = useInfiniteQuery({
		queryKey: ['security-events', qs],
		initialPageParam: null as number | null,
		queryFn: ({ pageParam }) => api<SecurityPage>(`/api/security-events?${qs}${pageParam ? `&before=${pageParam}` : ''}`),
		getNextPageParam: (last) => last.next,
	});
	const events = q.data?.pages.flatMap((p) => p.events) ?? [];
	return (
		<div className="space-y-4">
			<form className="card flex flex-wrap items-end gap-4" onSubmit={(e) => e.preventDefault()} aria-label="Filter the security log">
				<div>
					<label className="field-label" htmlFor="sec-kind">Events</label>
					<select id="sec-kind" className="field-input" value={kind} onChange={(e) => setKind(e.target.value as SecurityKind | 'all')}>
						<option value="all">All security events</option>
						{SECURITY_KIND_IDS.map((k) => (
							<option key={k} value={k}>{SECURITY_KINDS[k].label}</option>
						))}
					</select>
				</div>
				<div>
					<label className="field-label" htmlFor="sec-since">From (UTC day)</label>
					<input id="sec-since" className="field-input" type="date" value={since} onChange={(e) => setSince(e.target.value)} />
				</div>
				<div>
					<label className="field-label" htmlFor="sec-address">Address begins with</label>
					<input id="sec-address" className="field-input font-mono" value={address} placeholder="192.0.2." onChange={(e) => setAddress(e.target.value)} />
				</div>
				<a className="btn-secondary" href={`/api/security-events?${queryString(kind, since, address, { format: 'jsonl', limit: '500' })}`} data-testid="security-download">
					Download (JSON Lines, newest 500)
				</a>
			</form>
			{q.isError && <p className="notice-error" role="alert">{q.error.message}</p>}
			{q.isPending ? (
				<p role="status">Loading…</p>
			) : events.length === 0 ? (
				<p className="rounded-md border border-dashed border-ink-200 bg-white px-4 py-6">No events match these filters.</p>
			) : (
				<div className="card overflow-x-auto">
					<table className="w-full text-left text-sm" data-testid="security-events">
						<thead className="text-ink-600">
							<tr>
								<th className="py-2 pr-3 font-semibold">When</th>
								<th className="py-2 pr-3 font-semibold">What</th>
								<th className="py-2 pr-3 font-semibold">By</th>
								<th className="py-2 pr-3 font-semibold">Account</th>
								<th className="py-2 pr-3 font-semibold">From</th>
								<th className="py-2 font-semibold">Details</th>
							</tr>
						</thead>
						<tbody>
							{events.map((e) => (
								<Row key={e.id} e={e} />
							))}
						</tbody>
					</table>
					{q.hasNextPage && (
						<button type="button" className="btn-secondary mt-4" onClick={() => q.fetchNextPage()} disabled={q.isFetchingNextPage}>
							{q.isFetchingNextPage ? 'Loading…' : 'Older events'}
						</button>
					)}
				</div>
			)}
		</div>
	);
}

function Row({ e }: { e: SecurityEvent }) {
	const refused = e.action.includes('refused') || e.action.endsWith('.failed') || e.action.endsWith('.throttled');
	return (
		<tr className="border-t border-ink-100 align-top" data-testid="security-event" data-action={e.action}>
			<td className="whitespace-nowrap py-2 pr-3">
				<time dateTime={e.occurredAt} title={`${e.occurredAt.replace('T', ' ').slice(0, 19)} UTC`}>{new Date(e.occurredAt).toLocaleString()}</time>
			</td>
			<td className="py-2 pr-3">
				{refused && <span className="mr-1 rounded bg-alert-50 px-1 text-xs font-semibold text-alert-700">refused</span>}
				{ACTION_WORDS[e.action] ?? e.action}
			</td>
			<td className="py-2 pr-3">{e.actor ? `${e.actor.name} (${e.actor.email})` : '—'}</td>
			<td className="py-2 pr-3">{e.subject && e.subject.id !== e.actor?.id ? e.subject.email : e.subject ? 'own' : '—'}</td>
			<td className="py-2 pr-3 font-mono text-xs">{e.clientAddress ?? '—'}</td>
			<td className="py-2">
				<Detail e={e} />
			</td>
		</tr>
	);
}

/** The event's values in words; React escapes them, so nothing in a value is read as markup. */
function Detail({ e }: { e: SecurityEvent }) {
	const lines = [...(e.entityType === 'route' && e.entityId ? [`route: ${e.entityId}`] : []), ...describeDetail(e.detail)];
	if (lines.length === 0) return <span className="text-ink-500">—</span>;
	return (
		<ul className="space-y-0.5 text-xs text-ink-700">
			{lines.map((l, i) => (
				<li key={i} className="break-all">{l}</li>
			))}
		</ul>
	);
}
