import { render, screen, within } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import EqualSteps from '$lib/components/lab/EqualSteps.svelte';
import GelArithmetic from '$lib/components/lab/GelArithmetic.svelte';
import MiredConverter from '$lib/components/lab/MiredConverter.svelte';
import Worksheet from '$lib/components/lab/Worksheet.svelte';
import { makeWorksheet } from '$lib/components/lab/worksheet';

/** One decimal with a typographic minus, as the lab prints it. */
const shown = (v: number) => v.toFixed(1).replace('-', '−');

describe('MiredConverter', () => {
	it('converts kelvin to mired as you type (M = 10⁶ / K)', async () => {
		const user = userEvent.setup();
		render(MiredConverter);
		const k = screen.getByTestId('converter-kelvin');
		await user.clear(k);
		await user.type(k, '4300');
		expect(screen.getByTestId('converter-mired')).toHaveValue(shown(1e6 / 4300)); // 232.6
		expect(screen.getByTestId('converter-working')).toHaveTextContent('10⁶ ÷ 4300 K = 232.6 mired');
	});

	it('converts mired to kelvin the other way', async () => {
		const user = userEvent.setup();
		render(MiredConverter);
		const m = screen.getByTestId('converter-mired');
		await user.clear(m);
		await user.type(m, '200');
		expect(screen.getByTestId('converter-kelvin')).toHaveValue('5000');
		expect(screen.getByTestId('converter-working')).toHaveTextContent('10⁶ ÷ 200 mired = 5000 K');
	});

	it('says what is wrong with zero, negative or non-numeric input', async () => {
		const user = userEvent.setup();
		render(MiredConverter);
		const k = screen.getByTestId('converter-kelvin');
		for (const bad of ['0', '-5', 'warm']) {
			await user.clear(k);
			await user.type(k, bad);
			expect(screen.getByTestId('converter-working')).toHaveTextContent('Type a colour temperature above 0 K.');
		}
	});
});

describe('GelArithmetic', () => {
	it('works 3200 → 5600 K line by line: the shift is 10⁶/5600 − 10⁶/3200 = −133.9 mired (common practice worked example)', () => {
		render(GelArithmetic);
		const working = screen.getByTestId('gel-working');
		expect(screen.getByTestId('gel-step-source')).toHaveTextContent('312.5 mired');
		expect(screen.getByTestId('gel-step-target')).toHaveTextContent('178.6 mired');
		expect(screen.getByTestId('gel-step-shift')).toHaveTextContent(`${shown(1e6 / 5600 - 1e6 / 3200)} mired`);
		expect(shown(1e6 / 5600 - 1e6 / 3200)).toBe('−133.9');
		// Full CTB at the library's nominal −131 mired (common practice) lands at 10⁶ / (312.5 − 131) = 5510 K.
		const stacks = within(screen.getByTestId('gel-stacks')).getAllByRole('row');
		expect(stacks[1]).toHaveTextContent('Full CTB');
		expect(stacks[1]).toHaveTextContent(`${Math.round(1e6 / (1e6 / 3200 - 131))} K`);
		expect(working).toHaveTextContent('2.9 mired warmer');
		expect(working).toHaveTextContent(/Heat:/);
	});

	it('offers 3092 → 5600 K (−144.8 mired, common practice) and 6500 → 3200 K (+158.7) as presets', async () => {
		const user = userEvent.setup();
		render(GelArithmetic);
		await user.click(screen.getByRole('button', { name: '3092 → 5600 K' }));
		expect(screen.getByTestId('gel-step-shift')).toHaveTextContent('−144.8 mired');
		await user.click(screen.getByRole('button', { name: '6500 → 3200 K' }));
		expect(screen.getByTestId('gel-step-shift')).toHaveTextContent('+158.7 mired');
		expect(within(screen.getByTestId('gel-stacks')).getAllByRole('row')[1]).toHaveTextContent('Full CTO');
		expect(screen.getByRole('button', { name: '6500 → 3200 K' })).toHaveAttribute('aria-pressed', 'true');
	});

	it('asks for numbers when a box is empty', async () => {
		const user = userEvent.setup();
		render(GelArithmetic);
		await user.clear(screen.getByTestId('gel-source'));
		expect(screen.getByTestId('gel-working')).toHaveTextContent('Type both colour temperatures');
	});
});

describe('EqualSteps', () => {
	it('states the common-practice figures: 4000 → 3000 K is 83 mired, 7000 → 6000 K is 24', () => {
		render(EqualSteps);
		expect(document.body).toHaveTextContent('change of 83 mired');
		expect(document.body).toHaveTextContent('only 24 mired');
		expect(within(screen.getByTestId('steps-mired')).getByText(/Step sizes in mired: 50, 50, 50, 50, 50, 50, 50, 50\./)).toBeInTheDocument();
		expect(within(screen.getByTestId('steps-kelvin')).getByText(/Step sizes in mired: 167, 83, 50, 33, 24, 18, 14, 11\./)).toBeInTheDocument();
		// Both runs are plotted: 9 + 9 readings.
		expect(screen.getAllByTestId('steps-chart-point')).toHaveLength(18);
	});
});

describe('Worksheet', () => {
	it('prints the set’s questions and a key computed by the same generator', () => {
		render(Worksheet, { seed: 4821, onnewset: () => {} });
		const sheet = makeWorksheet(4821);
		const questions = screen.getAllByTestId('worksheet-question');
		expect(questions).toHaveLength(8);
		sheet.exercises.forEach((e, i) => expect(questions[i]).toHaveTextContent(e.question));
		const answers = screen.getAllByTestId('worksheet-answer').map((a) => a.textContent);
		expect(answers).toEqual(sheet.exercises.map((e) => e.answer));
		expect(screen.getByTestId('worksheet')).toHaveTextContent('set 4821');
		expect(screen.getByTestId('worksheet-key')).toHaveTextContent('Answer key · set 4821');
	});

	it('asks for a new set and can leave the key out of the print', async () => {
		const user = userEvent.setup();
		const onnewset = vi.fn();
		render(Worksheet, { seed: 1, onnewset });
		await user.click(screen.getByTestId('worksheet-new'));
		expect(onnewset).toHaveBeenCalledOnce();
		expect(screen.getByTestId('worksheet-key')).not.toHaveClass('no-print');
		await user.click(screen.getByLabelText('Print the answer key too'));
		expect(screen.getByTestId('worksheet-key')).toHaveClass('no-print');
	});
});
