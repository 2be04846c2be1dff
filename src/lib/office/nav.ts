import type { Role } from '$lib/server/platform/db/schema';

export interface NavItem {
	href: string;
	label: string;
	roles: readonly Role[];
}

// Sections appear here as they are built; each is shown only to the roles it serves.
export const OFFICE_NAV: readonly NavItem[] = [
	{ href: '/office', label: 'Today', roles: ['owner', 'sales', 'crew'] },
	{ href: '/office/leads', label: 'Leads', roles: ['owner', 'sales'] },
	{ href: '/office/visits', label: 'Visits', roles: ['owner', 'sales'] },
	{ href: '/office/estimates', label: 'Estimates', roles: ['owner', 'sales'] },
	{ href: '/office/jobs', label: 'Jobs', roles: ['owner', 'sales', 'crew'] },
	{ href: '/office/care', label: 'Care', roles: ['owner', 'sales'] },
	{ href: '/office/callbacks', label: 'Callbacks', roles: ['owner', 'sales', 'crew'] },
	{ href: '/office/payments', label: 'Payments', roles: ['owner'] },
	{ href: '/office/costing', label: 'Costing', roles: ['owner'] },
	{ href: '/office/price-list', label: 'Price list', roles: ['owner', 'sales'] },
	{ href: '/office/availability', label: 'Availability', roles: ['owner', 'sales'] },
	{ href: '/office/team', label: 'Team', roles: ['owner'] },
	{ href: '/office/settings', label: 'Settings', roles: ['owner'] },
	{ href: '/office/account/calendar', label: 'Calendar feed', roles: ['owner', 'sales', 'crew'] }
];

export function navFor(role: Role): NavItem[] {
	return OFFICE_NAV.filter((item) => item.roles.includes(role));
}
