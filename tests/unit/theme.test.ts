import { describe, expect, it } from 'vitest';
import { otherTheme, parseTheme } from '$lib/theme';

describe('theme', () => {
	it('defaults to the dark set theme for anything but "light"', () => {
		expect(parseTheme(undefined)).toBe('dark');
		expect(parseTheme('neon')).toBe('dark');
		expect(parseTheme('light')).toBe('light');
	});
	it('toggles between the two', () => {
		expect(otherTheme('dark')).toBe('light');
		expect(otherTheme('light')).toBe('dark');
	});
});
