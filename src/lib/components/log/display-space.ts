/**
 * Which colour space this screen can show swatches in: Display P3 when the screen covers it and the
 * browser understands `color(display-p3 …)`, else sRGB (also on the server, before any screen is known).
 *
 * References: W3C Media Queries Level 4 §6.4 (color-gamut); W3C CSS Color Module Level 4 §10
 * (predefined colour spaces, display-p3).
 */
export type DisplaySpace = 'srgb' | 'p3';

interface Env {
	matchMedia?: (query: string) => { matches: boolean };
	CSS?: { supports?: (property: string, value: string) => boolean };
}

export const P3_QUERY = '(color-gamut: p3)';

export function displaySpace(env: Env | undefined = typeof window === 'undefined' ? undefined : (window as unknown as Env)): DisplaySpace {
	if (!env) return 'srgb';
	try {
		const screen = env.matchMedia?.(P3_QUERY)?.matches === true;
		const css = typeof env.CSS?.supports === 'function' && env.CSS.supports('color', 'color(display-p3 1 1 1)');
		return screen && css ? 'p3' : 'srgb';
	} catch {
		return 'srgb';
	}
}

export const DISPLAY_SPACE_NAMES: Readonly<Record<DisplaySpace, string>> = { srgb: 'sRGB', p3: 'Display P3' };
