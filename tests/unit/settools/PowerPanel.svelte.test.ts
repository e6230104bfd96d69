/**
 * The power budget panel. Limits are common practice (80 % of V × A for continuous load:
 * 20 A at 120 V → 1,920 W continuous, 2,400 W breaker).
 */
import { render, screen, within } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it } from 'vitest';
import PowerPanel from '$lib/components/settools/PowerPanel.svelte';
import { POWER_STORAGE_KEY } from '$lib/settools/storage';

const setup = (storageKey: string | null = null) => ({ user: userEvent.setup({ delay: null }), ...render(PowerPanel, { storageKey }) });
type User = ReturnType<typeof userEvent.setup>;

async function addLight(user: User, name: string, watts: string, quantity = '1') {
	await user.type(screen.getByLabelText('Light name'), name);
	await user.type(screen.getByLabelText('Watts each'), watts);
	const qty = screen.getByLabelText('Qty');
	await user.clear(qty);
	await user.type(qty, quantity);
	await user.click(screen.getByRole('button', { name: 'Add light' }));
}

beforeEach(() => localStorage.clear());

// Typing through user-event is slow on a shared machine; the limit is generous, not a speed claim.
describe('PowerPanel', { timeout: 20_000 }, () => {
	it('common practice: a North America 20 A circuit offers 1,920 W continuous', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: /North America 20 A/ }));
		const card = screen.getByTestId('circuit-card');
		expect(card).toHaveTextContent('Breaker 2,400 W · continuous limit 1,920 W (16 A, 80 %)');
		expect(card).toHaveTextContent('1,920 W to spare');
		expect(screen.getByTestId('power-summary')).toHaveTextContent('Every circuit within its limit');
	});

	it('common practice: a light over the continuous limit raises a warning naming the excess', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: /North America 20 A/ }));
		await addLight(user, 'Big lamp', '2000');
		const alert = screen.getByRole('alert');
		expect(alert).toHaveTextContent('Over the continuous limit');
		expect(alert).toHaveTextContent('by 80 W');
		expect(screen.getByTestId('circuit-load')).toHaveTextContent('2,000 W · 16.7 A');
		expect(screen.getByTestId('power-summary')).toHaveTextContent('1 circuit is over the limit');
	});

	it('common practice: over the breaker rating says it will trip; moving the light clears it', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: /North America 20 A/ }));
		await user.click(screen.getByRole('button', { name: /North America 15 A/ }));
		// the form follows the newest circuit: put the light on Circuit 1 instead
		await user.selectOptions(screen.getByLabelText('On circuit'), 'Circuit 1');
		await addLight(user, 'Key', '1250', '2');
		expect(screen.getByRole('alert')).toHaveTextContent('Over the breaker rating by 100 W: it will trip.');
		await user.selectOptions(screen.getByLabelText('Circuit for Key'), 'Circuit 2');
		const cards = screen.getAllByTestId('circuit-card');
		expect(cards[1]).toHaveAttribute('data-level', 'over-breaker');
		expect(cards[0]).toHaveAttribute('data-level', 'clear');
	});

	it('a softer note close to the limit, and totals in watts and amps', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: /North America 20 A/ }));
		await addLight(user, 'Fill', '1800');
		expect(screen.queryByRole('alert')).toBeNull();
		expect(screen.getByTestId('circuit-card')).toHaveTextContent('Close to the continuous limit: 120 W to spare.');
		const summary = screen.getByTestId('power-summary');
		expect(summary).toHaveTextContent('1,800 W');
		expect(summary).toHaveTextContent('15 A at 120 V');
		expect(summary).toHaveTextContent('Close to the limit');
	});

	it('editing a circuit rating updates its limit (UK 13 A plug at 230 V)', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: /UK 13 A plug/ }));
		const card = screen.getByTestId('circuit-card');
		expect(card).toHaveTextContent('Breaker 2,990 W');
		const amps = within(card).getByLabelText('Breaker for Circuit 1');
		await user.clear(amps);
		await user.type(amps, '10');
		expect(card).toHaveTextContent('Breaker 2,300 W · continuous limit 1,840 W');
		await user.clear(amps);
		expect(card).toHaveTextContent('Check the rating');
	});

	it('rejects a light without watts', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: 'Add light' }));
		expect(screen.getByRole('alert')).toHaveTextContent('A light draws 0 W or more.');
	});

	it('keeps lights without a circuit in their own list', async () => {
		const { user } = setup();
		await addLight(user, 'Practical', '60');
		expect(screen.getByRole('heading', { name: 'Not on a circuit yet' })).toBeInTheDocument();
		expect(screen.getByTestId('power-summary')).toHaveTextContent('60 W in 1 light not on a circuit yet');
	});

	it('common practice: shows the standing cautions', () => {
		setup();
		const cautions = screen.getByRole('complementary', { name: /before you plug in/i });
		expect(cautions).toHaveTextContent(/tester/);
		expect(cautions).toHaveTextContent(/qualified person/);
	});

	it('keeps the plan across a reload', async () => {
		const first = setup(POWER_STORAGE_KEY);
		await first.user.click(screen.getByRole('button', { name: /Europe 16 A/ }));
		await addLight(first.user, 'Key', '1000');
		first.unmount();
		setup(POWER_STORAGE_KEY);
		expect(screen.getByTestId('circuit-load')).toHaveTextContent('1,000 W');
		expect(screen.getByLabelText('Name')).toHaveValue('Key');
	});
});
