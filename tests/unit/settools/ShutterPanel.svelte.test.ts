/**
 * The shutter panel. Expected angles are derived from the common-practice rule
 * (angle = 360 × fps × n / (2 × mains); any angle when 2 × mains / fps is whole).
 */
import { render, screen, within } from '@testing-library/svelte';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it } from 'vitest';
import ShutterPanel from '$lib/components/settools/ShutterPanel.svelte';
import { SHUTTER_STORAGE_KEY } from '$lib/settools/storage';

const setup = (storageKey: string | null = null) => ({ user: userEvent.setup({ delay: null }), ...render(ShutterPanel, { storageKey }) });
const safeTable = () => screen.getByRole('table', { name: /flicker-free shutter angles/i });
const verdict = () => screen.getByTestId('flicker-verdict');
const check = () => screen.getByTestId('shutter-check');

async function typeInto(user: ReturnType<typeof userEvent.setup>, label: string | RegExp, text: string) {
	const field = screen.getByLabelText(label);
	await user.clear(field);
	if (text) await user.type(field, text);
}

beforeEach(() => localStorage.clear());

// Typing through user-event is slow on a shared machine; the limit is generous, not a speed claim.
describe('ShutterPanel', { timeout: 20_000 }, () => {
	it('derived from the common-practice rule: 24 fps on 50 Hz lists 172.8° as safe, and 180° flickers', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: '60 Hz' }));
		await user.click(screen.getByRole('button', { name: '24 fps' }));
		await user.click(screen.getByRole('button', { name: '50 Hz' }));
		expect(screen.getByRole('button', { name: '24 fps' })).toHaveAttribute('aria-pressed', 'true');
		expect(screen.getByRole('button', { name: '50 Hz' })).toHaveAttribute('aria-pressed', 'true');
		expect(verdict()).toHaveTextContent('Only some shutter angles are flicker-free');
		const table = safeTable();
		expect(within(table).getByText('172.8°')).toBeInTheDocument();
		expect(within(table).getByText('345.6°')).toBeInTheDocument();
		expect(within(table).getByText('1/50 s')).toBeInTheDocument();
		expect(within(table).queryByText('180°')).toBeNull();

		await typeInto(user, 'Shutter angle (degrees)', '180');
		expect(check()).toHaveTextContent('Flickers');
		expect(check()).toHaveTextContent('7.2° wider than 172.8°');
		expect(check()).toHaveTextContent('4 Hz');

		await user.click(within(table).getByText('172.8°'));
		expect(check()).toHaveTextContent('Flicker-free');
		expect(screen.getByLabelText('Shutter angle (degrees)')).toHaveValue('172.8');
	});

	it('derived from the common-practice rule: 24 fps on 60 Hz allows any shutter angle', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: '24 fps' }));
		await user.click(screen.getByRole('button', { name: '60 Hz' }));
		expect(verdict()).toHaveTextContent(/any shutter angle/i);
		expect(check()).toHaveTextContent('Flicker-free');
	});

	it('derived from the common-practice rule: 23.976 on 60 Hz shows a slow beat of one cycle every 8.3 s', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: '60 Hz' }));
		await user.click(screen.getByRole('button', { name: '23.976 fps' }));
		expect(verdict()).toHaveTextContent('0.12 Hz');
		expect(verdict()).toHaveTextContent('one brightness cycle every 8.3 s');
		expect(verdict()).toHaveTextContent('Slow beat');
	});

	it('derived from the common-practice rule: 240 fps on 50 Hz has no safe shutter', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: '50 Hz' }));
		await user.click(screen.getByRole('button', { name: '240 fps' }));
		expect(verdict()).toHaveTextContent('No shutter angle is flicker-free');
		expect(verdict()).toHaveTextContent('Above 100 fps');
		expect(screen.queryByRole('table')).toBeNull();
	});

	it('derived from the common-practice rule: free entry, and shutter speed for 25 fps on 60 Hz', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: '60 Hz' }));
		await typeInto(user, 'Frame rate (fps)', '25');
		expect(within(safeTable()).getByText('150°')).toBeInTheDocument();
		await user.click(screen.getByRole('button', { name: 'Shutter speed' }));
		await typeInto(user, 'Shutter speed (1/x s)', '60');
		expect(check()).toHaveTextContent('Flicker-free');
		expect(check()).toHaveTextContent('1/60 s (150°)');
		await typeInto(user, 'Shutter speed (1/x s)', '50');
		expect(check()).toHaveTextContent('Flickers');
	});

	it('bad input shows a clear message instead of a verdict', async () => {
		const { user } = setup();
		await typeInto(user, 'Frame rate (fps)', '0');
		expect(verdict()).toHaveTextContent('The frame rate must be above 0 fps.');
		expect(screen.getByLabelText('Frame rate (fps)')).toHaveAttribute('aria-invalid', 'true');
		await typeInto(user, 'Frame rate (fps)', '');
		expect(verdict()).toHaveTextContent('Enter a frame rate');
		await typeInto(user, 'Frame rate (fps)', '24');
		await typeInto(user, 'Mains frequency (Hz)', '-50');
		expect(verdict()).toHaveTextContent('The mains frequency must be above 0 Hz.');
		await typeInto(user, 'Mains frequency (Hz)', '50');
		await typeInto(user, 'Shutter angle (degrees)', '400');
		expect(check()).toHaveTextContent('cannot be wider than 360°');
	});

	it('common practice: shows the standing notes', () => {
		setup();
		const notes = screen.getByRole('complementary', { name: /before you roll/i });
		expect(notes).toHaveTextContent(/magnetic ballasts and discharge lamps/);
		expect(notes).toHaveTextContent(/test shot/);
	});

	it('remembers the settings on this device', async () => {
		const first = setup(SHUTTER_STORAGE_KEY);
		await first.user.click(screen.getByRole('button', { name: '60 Hz' }));
		await first.user.click(screen.getByRole('button', { name: '48 fps' }));
		first.unmount();
		setup(SHUTTER_STORAGE_KEY);
		expect(screen.getByRole('button', { name: '48 fps' })).toHaveAttribute('aria-pressed', 'true');
		expect(within(safeTable()).getByText('144°')).toBeInTheDocument();
	});
});

describe('ShutterPanel facts', { timeout: 20_000 }, () => {
	it('common practice: always states the frame rate above which no shutter is safe (120 fps on 60 Hz)', async () => {
		const { user } = setup();
		await user.click(screen.getByRole('button', { name: '60 Hz' }));
		const facts = screen.getByTestId('flicker-facts');
		expect(facts).toHaveTextContent('No safe shutter above 120 fps');
		expect(facts).toHaveTextContent('120 Hz');
	});
});
