import type { ApiError } from '../../../lib/client/api.ts';

/** The server's refusal, with its per-field messages. */
export function ApiProblem({ error }: { error: ApiError | null }) {
	if (!error) return null;
	return (
		<div className="notice-error" role="alert">
			<p>{error.message}</p>
			{error.fields.map((f, i) => (
				<p key={i}>{f.message}</p>
			))}
		</div>
	);
}
