import { render, screen, within } from '@testing-library/svelte';
import { describe, expect, it } from 'vitest';
import { cieIlluminant, colourRenderingIndex } from '$lib/colour';
import CriBars from '$lib/components/charts/CriBars.svelte';

const criOf = (name: 'A' | 'F2' | 'F7') => {
	const c = colourRenderingIndex(cieIlluminant(name));
	return { ra: c.Ra, r: c.R };
};
const bar = (key: string) => screen.getAllByTestId('cri-bars-bar').find((b) => b.getAttribute('data-key') === key)!;
const valueOf = (key: string) => within(bar(key)).getByTestId('cri-bars-value').textContent;
const rectOf = (key: string) => within(bar(key)).getByTestId('cri-bars-rect');

describe('CriBars', () => {
	it('CIE 15:2004 Table T.8: F2 prints Ra 64 (from memory); its R9 is negative and drawn left of the zero line', () => {
		render(CriBars, { cri: criOf('F2') });
		expect(valueOf('Ra')).toBe('64');
		const zero = Number(screen.getByTestId('cri-bars-zero').getAttribute('x1'));
		const r9 = rectOf('R9');
		expect(Number(bar('R9').getAttribute('data-value'))).toBeLessThan(0);
		expect(valueOf('R9')!.startsWith('−')).toBe(true);
		expect(Number(r9.getAttribute('x')) + Number(r9.getAttribute('width'))).toBeCloseTo(zero, 1);
		// A positive index starts at the zero line.
		expect(Number(rectOf('R1').getAttribute('x'))).toBeCloseTo(zero, 1);
	});

	it('CIE 15:2004 Table T.8: F7 prints Ra 90 (from memory)', () => {
		render(CriBars, { cri: criOf('F7') });
		expect(valueOf('Ra')).toBe('90');
	});

	it('CIE 13.3-1995 §5: illuminant A is its own reference, so every index prints 100 and no bar is negative', () => {
		render(CriBars, { cri: criOf('A') });
		const values = screen.getAllByTestId('cri-bars-value').map((v) => v.textContent);
		expect(values).toEqual(new Array(16).fill('100'));
		expect(Number(screen.getByTestId('cri-bars-zero').getAttribute('x1'))).toBe(Number(rectOf('Ra').getAttribute('x')));
	});

	it('marks Ra and R9 by outline and weight, not colour alone, and draws guides at 85 and 90', () => {
		render(CriBars, { cri: criOf('F2') });
		const marked = screen.getAllByTestId('cri-bars-bar').filter((b) => b.getAttribute('data-marked') === 'true').map((b) => b.getAttribute('data-key'));
		expect(marked).toEqual(['Ra', 'R9']);
		expect(rectOf('R9').getAttribute('stroke-width')).toBe('1.5');
		expect(rectOf('R8').getAttribute('stroke-width')).toBe('0');
		expect(within(bar('R9')).getByTestId('cri-bars-value')).toHaveAttribute('font-weight', '700');
		expect(screen.getAllByTestId('cri-bars-guide').map((g) => g.getAttribute('data-value'))).toEqual(['85', '90']);
		expect(screen.getByTestId('cri-bars-key')).toHaveTextContent('R9');
	});

	it('lists every index with its sample in a table, to one decimal', () => {
		const c = criOf('F2');
		render(CriBars, { cri: c });
		const rows = within(screen.getByTestId('cri-bars-table')).getAllByRole('row');
		expect(rows).toHaveLength(17);
		const r9 = rows.find((r) => within(r).queryByRole('rowheader')?.textContent === 'R9')!;
		expect(r9).toHaveTextContent('strong red');
		expect(r9).toHaveTextContent(c.r[8].toFixed(1).replace('-', '−'));
	});

	it('says why there are no bars when there is no CRI', () => {
		render(CriBars, { cri: null, empty: 'No CRI: it needs a spectrum.' });
		expect(screen.getByTestId('cri-bars-empty')).toHaveTextContent('No CRI: it needs a spectrum.');
		expect(screen.queryAllByTestId('cri-bars-bar')).toHaveLength(0);
	});
});
