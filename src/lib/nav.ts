/** The product's areas, in the order the header shows them. `href: null` marks an area still to come. */
export interface NavItem {
	label: string;
	href: string | null;
	description: string;
}

export const NAV_ITEMS: readonly NavItem[] = [
	{ label: 'Projects', href: '/projects', description: 'Lighting logs: shoot days, setups, lights and readings' },
	{ label: 'Mired lab', href: '/lab', description: 'Kelvin and mired arithmetic for teaching' },
	{ label: 'Set tools', href: '/tools', description: 'Flicker-safe shutter and power plan' },
	{ label: 'Library', href: '/library', description: 'Fixture profiles and filters' }
];
