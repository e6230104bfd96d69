/** The two looks: `dark` for a dim set (the default), `light` for a desk or a projector. */
export type Theme = 'dark' | 'light';

export const THEME_COOKIE = 'cs_theme';

export function parseTheme(value: string | null | undefined): Theme {
	return value === 'light' ? 'light' : 'dark';
}

export function otherTheme(theme: Theme): Theme {
	return theme === 'dark' ? 'light' : 'dark';
}
