import type { Role } from '../auth/roles.ts';

/** The main navigation. Each issue that adds a screen adds its entry here, with who sees it. */
export interface NavItem {
	href: string;
	label: string;
	roles: readonly Role[] | 'all';
}

export const NAV_ITEMS: readonly NavItem[] = [
	{ href: '/', label: 'Home', roles: 'all' },
	{ href: '/specimens', label: 'Register', roles: 'all' },
	// The curator's home is the overview already.
	{ href: '/overview', label: 'Overview', roles: ['conservator', 'reviewer'] },
	{ href: '/fluid', label: 'Fluid tools', roles: 'all' },
	{ href: '/admin/users', label: 'Users', roles: ['admin'] },
	{ href: '/admin/lists', label: 'Lists', roles: ['admin'] },
	{ href: '/admin/security', label: 'Security log', roles: ['admin'] },
	{ href: '/admin/mailbox', label: 'Mailbox', roles: ['admin'] },
];

export function navFor(role: Role): NavItem[] {
	return NAV_ITEMS.filter((i) => i.roles === 'all' || i.roles.includes(role));
}
