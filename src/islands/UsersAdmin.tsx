import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState, type SubmitEvent } from 'react';
import { QueryRoot } from './QueryRoot.tsx';
import { api, ApiError } from '../lib/client/api.ts';
import { ROLES, ROLE_LABELS, type Role } from '../lib/auth/roles.ts';
import { CreateUserSchema, type UserView } from '../lib/users/schema.ts';

/** Users and roles: the list, inviting a person, changing a role, disabling and enabling. */
export default function UsersAdmin({ selfId }: { selfId: string }) {
	return (
		<QueryRoot>
			<Users selfId={selfId} />
		</QueryRoot>
	);
}

function Users({ selfId }: { selfId: string }) {
	const q = useQuery({ queryKey: ['users'], queryFn: () => api<{ users: UserView[] }>('/api/users') });
	return (
		<div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
			<section className="card overflow-x-auto" aria-labelledby="users-h">
				<h2 id="users-h" className="text-xl font-semibold">People</h2>
				{q.isPending && <p role="status">Loading…</p>}
				{q.isError && <p className="notice-error" role="alert">{q.error.message}</p>}
				{q.data && (
					<table className="mt-3 w-full min-w-[36rem] text-left text-sm">
						<thead className="text-ink-600">
							<tr>
								<th className="py-2 pr-3">Name and e-mail</th>
								<th className="py-2 pr-3">Role</th>
								<th className="py-2 pr-3">State</th>
								<th className="py-2">Actions</th>
							</tr>
						</thead>
						<tbody>
							{q.data.users.map((u) => (
								<UserRow key={u.id} user={u} self={u.id === selfId} />
							))}
						</tbody>
					</table>
				)}
			</section>
			<InviteForm />
		</div>
	);
}

function UserRow({ user, self }: { user: UserView; self: boolean }) {
	const qc = useQueryClient();
	const [message, setMessage] = useState<string | null>(null);
	const update = useMutation({
		mutationFn: (patch: Partial<Pick<UserView, 'role' | 'disabled'>>) =>
			api<{ user: UserView }>(`/api/users/${user.id}`, { method: 'PATCH', body: patch }),
		onSuccess: () => {
			setMessage('Saved.');
			return qc.invalidateQueries({ queryKey: ['users'] });
		},
		onError: (e) => setMessage(e.message),
	});
	const invite = useMutation({
		mutationFn: () => api(`/api/users/${user.id}/invitation`, { method: 'POST' }),
		onSuccess: () => setMessage('A new invitation is on its way.'),
		onError: (e) => setMessage(e.message),
	});
	const state = user.disabled ? 'Disabled' : user.hasPassword ? 'Active' : 'Invited';
	return (
		<tr className="border-t border-ink-100 align-top" data-testid={`user-${user.email}`}>
			<td className="py-3 pr-3">
				<div className="font-semibold">{user.name}{self && ' (you)'}</div>
				<div className="text-ink-600">{user.email}</div>
			</td>
			<td className="py-3 pr-3">
				<label className="sr-only" htmlFor={`role-${user.id}`}>Role of {user.name}</label>
				<select
					id={`role-${user.id}`}
					className="field-input mt-0 w-40"
					value={user.role}
					disabled={self || update.isPending}
					onChange={(e) => {
						const role = e.target.value as Role;
						// A role decides what a person may see and sign off: ask before changing it.
						if (window.confirm(`Change ${user.name}’s role to ${ROLE_LABELS[role]}? It applies on their next request.`)) {
							update.mutate({ role });
						} else e.target.value = user.role;
					}}
				>
					{ROLES.map((r) => (
						<option key={r} value={r}>{ROLE_LABELS[r]}</option>
					))}
				</select>
			</td>
			<td className="py-3 pr-3">
				<span className={user.disabled ? 'text-alert-700' : 'text-ink-800'}>{state}</span>
			</td>
			<td className="py-3">
				<div className="flex flex-wrap gap-2">
					{!self && (
						<button
							className="btn-secondary"
							type="button"
							disabled={update.isPending}
							onClick={() => {
								const verb = user.disabled ? 'Enable' : 'Disable';
								if (window.confirm(`${verb} ${user.name}’s account?${user.disabled ? '' : ' They are signed out at once.'}`)) {
									update.mutate({ disabled: !user.disabled });
								}
							}}
						>
							{user.disabled ? 'Enable' : 'Disable'}
						</button>
					)}
					{!user.hasPassword && !user.disabled && (
						<button className="btn-secondary" type="button" disabled={invite.isPending} onClick={() => invite.mutate()}>
							Send invitation again
						</button>
					)}
				</div>
				{message && <p className="mt-1 text-xs text-ink-700" role="status">{message}</p>}
			</td>
		</tr>
	);
}

function InviteForm() {
	const qc = useQueryClient();
	const [fields, setFields] = useState<Record<string, string>>({});
	const [done, setDone] = useState<string | null>(null);
	const create = useMutation({
		mutationFn: (body: unknown) => api<{ user: UserView }>('/api/users', { method: 'POST', body }),
		onSuccess: (r) => {
			setDone(`Invitation sent to ${r.user.email}.`);
			return qc.invalidateQueries({ queryKey: ['users'] });
		},
		onError: (e) => {
			if (e instanceof ApiError && e.fields.length) setFields(Object.fromEntries(e.fields.map((f) => [f.path, f.message])));
			else setFields({ form: e.message });
		},
	});
	function submit(ev: SubmitEvent<HTMLFormElement>) {
		ev.preventDefault();
		setDone(null);
		const data = Object.fromEntries(new FormData(ev.currentTarget));
		// The same schema as the server, so most mistakes are shown before anything is sent.
		const parsed = CreateUserSchema.safeParse(data);
		if (!parsed.success) {
			setFields(Object.fromEntries(parsed.error.issues.map((i) => [i.path.join('.'), i.message])));
			return;
		}
		setFields({});
		create.mutate(parsed.data, { onSuccess: () => (ev.target as HTMLFormElement).reset() });
	}
	return (
		<section className="card" aria-labelledby="invite-h">
			<h2 id="invite-h" className="text-xl font-semibold">Invite a person</h2>
			<p className="mt-1 text-sm text-ink-600">They receive an e-mail with a link to choose their own password.</p>
			<form className="mt-4 space-y-4" onSubmit={submit} noValidate>
				<Field name="name" label="Name" error={fields.name} autoComplete="off" />
				<Field name="email" label="E-mail address" type="email" error={fields.email} autoComplete="off" />
				<div>
					<label className="field-label" htmlFor="invite-role">Role</label>
					<select id="invite-role" name="role" className="field-input" defaultValue="conservator">
						{ROLES.map((r) => (
							<option key={r} value={r}>{ROLE_LABELS[r]}</option>
						))}
					</select>
					{fields.role && <p className="field-error">{fields.role}</p>}
				</div>
				{fields.form && <p className="notice-error" role="alert">{fields.form}</p>}
				{done && <p className="notice-info" role="status">{done}</p>}
				<button className="btn-primary w-full" type="submit" disabled={create.isPending}>
					{create.isPending ? 'Sending…' : 'Send the invitation'}
				</button>
			</form>
		</section>
	);
}

function Field(props: { name: string; label: string; type?: string; error?: string; autoComplete?: string }) {
	const id = `invite-${props.name}`;
	return (
		<div>
			<label className="field-label" htmlFor={id}>{props.label}</label>
			<input
				id={id}
				name={props.name}
				type={props.type ?? 'text'}
				className="field-input"
				autoComplete={props.autoComplete}
				aria-invalid={props.error ? true : undefined}
				aria-describedby={props.error ? `${id}-err` : undefined}
			/>
			{props.error && <p id={`${id}-err`} className="field-error">{props.error}</p>}
		</div>
	);
}
