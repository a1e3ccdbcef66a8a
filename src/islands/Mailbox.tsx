import { useQuery } from '@tanstack/react-query';
import { QueryRoot } from './QueryRoot.tsx';
import { api } from '../lib/client/api.ts';
import type { MailboxMessage } from '../lib/server/mail/fakeSmtp.ts';

/** The development mailbox: what the local fake SMTP server caught, newest first. */
export default function Mailbox() {
	return (
		<QueryRoot>
			<Messages />
		</QueryRoot>
	);
}

function Messages() {
	const q = useQuery({
		queryKey: ['mailbox'],
		queryFn: () => api<{ enabled: boolean; messages: MailboxMessage[] }>('/api/dev/mailbox'),
		refetchInterval: 5000,
	});
	if (q.isPending) return <p role="status">Loading…</p>;
	if (q.isError) return <p className="notice-error" role="alert">{q.error.message}</p>;
	if (!q.data.enabled) {
		return <p className="notice-info">This server sends real e-mail; there is no local mailbox to show.</p>;
	}
	if (q.data.messages.length === 0) {
		return <p className="rounded-md border border-dashed border-ink-200 bg-white px-4 py-6">No messages yet. Invitations, password resets, review mail and the daily digest of checks coming due will appear here.</p>;
	}
	return (
		<ul className="space-y-4">
			{q.data.messages.map((m) => (
				<li key={m.id} className="card" data-testid="mail">
					<div className="flex flex-wrap justify-between gap-2 text-sm text-ink-600">
						<span>To {m.envelopeTo.join(', ')}</span>
						<time dateTime={m.receivedAt}>{new Date(m.receivedAt).toLocaleString()}</time>
					</div>
					<h2 className="mt-1 text-lg font-semibold">{m.subject}</h2>
					<pre className="mt-3 whitespace-pre-wrap break-words font-sans text-sm text-ink-800">{linkify(m.text)}</pre>
				</li>
			))}
		</ul>
	);
}

/** Makes the links of this site clickable; everything else stays text (never parsed as HTML). */
function linkify(text: string) {
	return text.split(/(https?:\/\/\S+)/g).map((part, i) =>
		/^https?:\/\//.test(part) && part.startsWith(window.location.origin) ? (
			<a key={i} href={part} className="text-glass-700 underline">{part}</a>
		) : (
			part
		),
	);
}
