import { describe, expect, it } from 'vitest';
import { cameraWhiteBalance } from '../../../src/lib/matching/camera';
import { resolveTargetWhite } from '../../../src/lib/matching/target';
import { cctTarget } from './factories';

describe('cameraWhiteBalance', () => {
	it('balances on the target CCT; a greenish target (Duv > 0, Ohno 2014) needs the tint toward magenta', () => {
		const wb = cameraWhiteBalance(cctTarget(5600, 0.003));
		expect(wb.kelvin).toBe(5600);
		expect(wb.tint).toBe('magenta');
		expect(wb.duv!).toBeCloseTo(0.003, 5);
		expect(wb.note).toMatch(/5600 K/);
	});
	it('a magenta-ish target (Duv < 0) needs green; a target on the locus needs none', () => {
		expect(cameraWhiteBalance(cctTarget(3200, -0.002)).tint).toBe('green');
		expect(cameraWhiteBalance(cctTarget(3200, 0)).tint).toBe('none');
		expect(cameraWhiteBalance(cctTarget(3212, 0)).kelvin).toBe(3210);
	});
	it('gives no kelvin for a target far from white', () => {
		const wb = cameraWhiteBalance(resolveTargetWhite({ kind: 'xy', x: 0.2, y: 0.6 }));
		expect(wb.kelvin).toBeNull();
		expect(wb.note).toMatch(/grey card/);
	});
});
