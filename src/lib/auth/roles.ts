/**
 * The four roles of DESIGN.md §2. A user has exactly one. What each may do is declared route by
 * route in `permissions.ts`; this module only names them and says how to show them.
 */
export const ROLES = ['conservator', 'reviewer', 'curator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
	conservator: 'Conservator',
	reviewer: 'Reviewer',
	curator: 'Curator',
	admin: 'Administrator',
};

export const ROLE_SUMMARIES: Record<Role, string> = {
	conservator: 'Registers specimens, opens condition checks, photographs, maps damage, records fluid and treatment.',
	reviewer: 'Reads every record, works the review queue, approves or returns checks, signs off risk assessments.',
	curator: 'Reads everything, follows each specimen’s history, sets priorities, exports reports.',
	admin: 'Manages users and roles, vocabularies and storage locations; approves nothing of their own.',
};

export function isRole(value: unknown): value is Role {
	return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
