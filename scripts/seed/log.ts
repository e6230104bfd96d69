/**
 * The demo lighting log (invented, demo only). Two nights in an invented all-night laundromat on a
 * 230 V 50 Hz supply, then a studio day rebuilding its counter corner. Every spectrum is generated
 * from a model here, never copied from a product:
 *   - ceiling tubes: a smooth two-band phosphor base plus the mercury lines at 405, 436, 546 and 578 nm;
 *   - the LED sign and the white channel of the key panel: a blue emitter peak plus a broad phosphor band;
 *   - the key panel's red, green and blue channels: narrow Gaussian emitters;
 *   - tungsten: a Planckian radiator (with the colour core's modelled filter over it where gelled);
 *   - the streetlight: a near-monochromatic 589 nm line, as low-pressure sodium is.
 * Readings are stored through the readings service, so their computed values are real.
 *
 * Idempotent: when the demo project already has its first night, nothing is added.
 */
import { planckianSpectrum, valueAt, type Spectrum } from '../../src/lib/colour';
import { gelLibrary } from '../../src/lib/matching/gels/library';
import { loadProjectFor } from '../../src/lib/server/authz';
import * as comments from '../../src/lib/server/db/comments';
import * as shootDays from '../../src/lib/server/db/shoot-days';
import * as log from '../../src/lib/server/services/log';
import type { StoredSpectrum } from '../../src/lib/server/db/readings';
import type { LightInput } from '../../src/lib/server/services/log';
import { need, type SeedContext } from './context';

const START = 380;
const END = 780;
const GRID = Array.from({ length: END - START + 1 }, (_, i) => START + i);
const gauss = (nm: number, centre: number, sigma: number) => Math.exp(-0.5 * ((nm - centre) / sigma) ** 2);

function stored(values: number[]): StoredSpectrum {
	const max = Math.max(...values);
	return { start: START, interval: 1, values: values.map((v) => Number(((100 * v) / max).toFixed(4))), scale: 'relative' };
}

/** Tube fluorescent model: phosphor bands (blue ~450 nm, yellow-orange ~580 nm) plus mercury lines. */
function tubeSpectrum(warmth = 1): StoredSpectrum {
	return stored(GRID.map((nm) => 0.35 * gauss(nm, 450, 28) + 0.9 * warmth * gauss(nm, 585, 55) + 0.6 * gauss(nm, 405, 1.5) + 1.1 * gauss(nm, 436, 1.5) + 1.6 * gauss(nm, 546, 1.5) + 0.7 * gauss(nm, 578, 1.5)));
}

/** Phosphor-converted LED model: blue emitter plus a broad phosphor band. */
function pcLedSpectrum(blue: number, phosphorCentre = 560, phosphorWidth = 55): StoredSpectrum {
	return stored(GRID.map((nm) => blue * gauss(nm, 452, 10) + gauss(nm, phosphorCentre, phosphorWidth)));
}

/** RGBW panel model at channel levels 0–1: R 630 nm, G 525 nm, B 455 nm emitters and a phosphor white. */
function rgbwSpectrum(l: { R: number; G: number; B: number; W: number }): StoredSpectrum {
	return stored(GRID.map((nm) => l.R * 0.8 * gauss(nm, 630, 9) + l.G * 0.6 * gauss(nm, 525, 15) + l.B * 0.7 * gauss(nm, 455, 10) + l.W * (0.9 * gauss(nm, 452, 10) + gauss(nm, 565, 60))));
}

/** Low-pressure sodium model: one line at 589 nm with a trace of continuum. */
function sodiumSpectrum(): StoredSpectrum {
	return stored(GRID.map((nm) => gauss(nm, 589, 1.2) + 0.0002));
}

/** A Planckian at T kelvin, optionally under modelled filters from the colour core's library. */
function tungstenSpectrum(T: number, gels: string[] = []): StoredSpectrum {
	const source: Spectrum = planckianSpectrum(T, START, END, 1);
	const library = gelLibrary();
	const filters = gels.map((id) => library.find((g) => g.id === id)!.transmission);
	return stored(GRID.map((nm, i) => filters.reduce((v, t) => v * valueAt(t, nm, 'hold'), source.values[i])));
}

const raw = (spectrum: StoredSpectrum, lux: number) => ({ kind: 'spectral' as const, spectrum, lux });
const at = (date: string, time: string) => `${date}T${time}:00.000Z`;

interface LightPlan {
	/** `circuit`: index into the setup's circuits. */
	light: Omit<LightInput, 'circuitId'> & { circuit?: number };
	readings: { label: string; time: string; spectrum: StoredSpectrum; lux: number }[];
}

export async function seedLightingLog(ctx: SeedContext): Promise<void> {
	const project = need(ctx.project, 'the demo project');
	const gafferUser = need(ctx.users.gaffer, 'the demo gaffer');
	const dpUser = need(ctx.users.dp, 'the demo DP');
	const colorist = need(ctx.users.colorist, 'the demo colorist');
	const existing = await shootDays.list(project.id);
	if (existing.items.some((d) => d.label === 'Night 1')) return;

	const gaffer = await loadProjectFor({ id: gafferUser.id, email: gafferUser.email, name: gafferUser.name, isAdmin: false }, project.id);
	const dp = await loadProjectFor({ id: dpUser.id, email: dpUser.email, name: dpUser.name, isAdmin: false }, project.id);
	const location = 'The Blue Drum laundromat (invented)';
	const mains = { mainsVoltage: 230, mainsFrequency: 50 };
	const night1 = await log.createDay(gaffer, { date: '2026-12-01', label: 'Night 1', locationName: location, ...mains, notes: 'Invented demo data. Ceiling tubes stay on all night; the streetlight outside is sodium.' });
	const night2 = await log.createDay(gaffer, { date: '2026-12-02', label: 'Night 2', locationName: location, ...mains, notes: 'Invented demo data. Same location, reverse angles through the front window.' });
	const studio = await log.createDay(gaffer, { date: '2026-12-04', label: 'Studio day', locationName: 'Stage 2, an invented studio', ...mains, notes: 'Invented demo data. The counter corner rebuilt on stage, matched to the location.' });

	async function setup(dayId: number, name: string, notes: string, circuitSpecs: { label: string; amps: number }[], plans: LightPlan[], date: string) {
		const s = await log.createSetup(gaffer, { shootDayId: dayId, name, notes, status: 'planning' });
		const circuitIds: number[] = [];
		for (const c of circuitSpecs) circuitIds.push((await log.createCircuit(gaffer, s.id, { label: c.label, preset: c.amps === 16 ? 'eu-16' : null, volts: 230, amps: c.amps, derating: 0.8 })).id);
		const made: { id: number; readings: number[] }[] = [];
		for (const plan of plans) {
			const { circuit, ...fields } = plan.light;
			const l = await log.createLight(gaffer, s.id, { ...fields, circuitId: circuit === undefined ? null : circuitIds[circuit] });
			const ids: number[] = [];
			for (const r of plan.readings) ids.push((await log.addReading(gaffer, l.id, { label: r.label, raw: raw(r.spectrum, r.lux), takenAt: at(date, r.time), meter: 'Spectrometer (demo model)' })).id);
			made.push({ id: l.id, readings: ids });
		}
		return { setup: s, lights: made };
	}

	const tubes = (label: string, time: string, warmth = 1): LightPlan => ({
		light: { label: 'House tubes (ceiling)', role: 'ambient', kind: 'fluorescent', notes: 'Fixed in the ceiling; the owner keeps them on. Not on our circuits.' },
		readings: [{ label, time, spectrum: tubeSpectrum(warmth), lux: 310 }]
	});
	const sodium = (time: string): LightPlan => ({
		light: { label: 'Streetlight through the window', role: 'background', kind: 'sodium', notes: 'Low-pressure sodium outside: no gel or grade brings colours back under it. Keep it off faces.' },
		readings: [{ label: 'Street sodium', time, spectrum: sodiumSpectrum(), lux: 12 }]
	});
	const sign = (time: string, circuit: number): LightPlan => ({
		light: { label: 'LED sign over the counter', role: 'practical', kind: 'led-white', powerW: 45, circuit, notes: 'Cool white sign, mains driven.' },
		readings: [{ label: 'Sign', time, spectrum: pcLedSpectrum(1.6, 555, 50), lux: 40 }]
	});

	// Night 1, wide: the crew matches its lamps to the house tubes (target = the tubes' reading).
	const wide = await setup(
		night1.id,
		'Wide: the row of machines',
		'Target is the ceiling tubes: everything we add is brought to them.',
		[{ label: 'Wall sockets by the door', amps: 16 }, { label: 'Back-room socket', amps: 16 }],
		[
			tubes('Tubes, centre of room', '20:10'),
			sodium('20:14'),
			sign('20:16', 1),
			{
				light: { label: 'Key panel (RGBW)', role: 'key', kind: 'led-rgbw', fixtureProfile: 'generic-rgbw', ledSettings: { channels: { R: 35, G: 30, B: 0, W: 80 }, intensity: 70 }, dimmerPercent: null, powerW: 220, circuit: 0 },
				readings: [
					{ label: 'Key, first look', time: '20:20', spectrum: rgbwSpectrum({ R: 0.2, G: 0.1, B: 0.05, W: 0.8 }), lux: 900 },
					{ label: 'Key, after the fix', time: '20:41', spectrum: rgbwSpectrum({ R: 0.35, G: 0.3, B: 0, W: 0.8 }), lux: 860 }
				]
			},
			{
				light: { label: 'Tungsten fresnel backlight', role: 'back', kind: 'tungsten', gelStack: ['ctb-half', 'plusgreen-quarter'], dimmerPercent: 80, powerW: 1000, circuit: 1 },
				readings: [
					{ label: 'Back, bare', time: '20:25', spectrum: tungstenSpectrum(3150), lux: 1400 },
					{ label: 'Back, ½ CTB + ¼ plus green', time: '20:48', spectrum: tungstenSpectrum(3150, ['ctb-half', 'plusgreen-quarter']), lux: 640 }
				]
			}
		],
		'2026-12-01'
	);
	const tubeReading = wide.lights[0].readings[0];
	const wideV = async () => (await log.readSetup(dp, wide.setup.id))!.version;
	await log.setTarget(dp, wide.setup.id, { kind: 'reading', readingId: tubeReading }, 0.003, await wideV());
	await log.lockTarget(dp, wide.setup.id, true, await wideV());
	await log.acceptFix(gaffer, wide.lights[4].id, { kind: 'gel', fix: { stack: ['ctb-half', 'plusgreen-quarter'] }, note: 'Brings the back toward the tubes (demo).' });
	await log.acceptFix(gaffer, wide.lights[3].id, { kind: 'led', fix: { levels: { R: 35, G: 30, B: 0, W: 80 }, intensity: 70 }, note: 'Green added to sit with the tubes (demo).' });
	await log.updateSetup(gaffer, wide.setup.id, { status: 'shot' }, await wideV());
	await log.lockSetup(dp, wide.setup.id, true, await wideV());

	// Night 1, close: a CCT + Duv target near the tubes.
	const close = await setup(
		night1.id,
		'Close: at the counter',
		'Faces lit by the key; the sign stays in frame as a practical.',
		[{ label: 'Counter socket', amps: 16 }],
		[
			tubes('Tubes over the counter', '22:05', 1.05),
			sign('22:07', 0),
			{
				light: { label: 'Key panel (RGBW)', role: 'key', kind: 'led-rgbw', fixtureProfile: 'generic-rgbw', ledSettings: { channels: { R: 30, G: 25, B: 0, W: 75 } }, powerW: 220, circuit: 0 },
				readings: [{ label: 'Key on the face', time: '22:12', spectrum: rgbwSpectrum({ R: 0.3, G: 0.25, B: 0, W: 0.75 }), lux: 700 }]
			},
			{
				light: { label: 'Bounce fill', role: 'fill', kind: 'led-bicolour', ledSettings: { cct_k: 4000, gm: 10, intensity: 30 }, powerW: 150, circuit: 0 },
				readings: []
			}
		],
		'2026-12-01'
	);
	await log.setTarget(dp, close.setup.id, { kind: 'cct_duv', cct_k: 4000, duv: 0.003 }, undefined, (await log.readSetup(dp, close.setup.id))!.version);
	await log.updateSetup(gaffer, close.setup.id, { status: 'lit' }, (await log.readSetup(dp, close.setup.id))!.version);

	// Night 2: the window two-shot, still in planning, with a circuit over its continuous limit.
	const window = await setup(
		night2.id,
		'Window two-shot',
		'Sodium rim from the street; the tungsten unit outside needs its own feed.',
		[{ label: 'Front socket (shared with the dryers!)', amps: 10 }],
		[
			sodium('21:30'),
			{
				light: { label: 'Tungsten fresnel outside', role: 'key', kind: 'tungsten', gelStack: ['cto-quarter'], powerW: 2000, circuit: 0, notes: 'Warm key from outside to sit with the sodium.' },
				readings: [{ label: 'Outside key, ¼ CTO', time: '21:40', spectrum: tungstenSpectrum(3200, ['cto-quarter']), lux: 1100 }]
			},
			{ light: { label: 'Key panel (RGBW)', role: 'fill', kind: 'led-rgbw', fixtureProfile: 'generic-rgbw', ledSettings: { channels: { R: 60, G: 20, B: 0, W: 30 } }, powerW: 220, circuit: 0 }, readings: [] }
		],
		'2026-12-02'
	);
	await log.setTarget(dp, window.setup.id, { kind: 'cct_duv', cct_k: 3400, duv: 0 }, undefined, (await log.readSetup(dp, window.setup.id))!.version);

	// Studio: the counter corner rebuilt, aiming for the tubes as measured on location.
	const tubesOnLocation = (await log.resolveTarget(project.id, { kind: 'reading', readingId: tubeReading }, 0.003))!;
	const rebuild = await setup(
		studio.id,
		'Counter rebuild (matched to location)',
		'No tubes on stage: the ceiling is a soft LED source set to the location tubes’ chromaticity.',
		[{ label: 'Stage distro A', amps: 16 }, { label: 'Stage distro B', amps: 16 }],
		[
			{
				light: { label: 'Soft ceiling (RGBW)', role: 'ambient', kind: 'led-rgbw', fixtureProfile: 'generic-rgbw', ledSettings: { channels: { R: 30, G: 40, B: 0, W: 80 } }, powerW: 880, circuit: 0 },
				readings: [{ label: 'Ceiling soft', time: '10:15', spectrum: rgbwSpectrum({ R: 0.3, G: 0.4, B: 0, W: 0.8 }), lux: 320 }]
			},
			{ light: { label: 'Sign replica', role: 'practical', kind: 'led-white', powerW: 45, circuit: 1 }, readings: [{ label: 'Replica sign', time: '10:20', spectrum: pcLedSpectrum(1.6, 555, 50), lux: 38 }] },
			{
				light: { label: 'Sodium stand-in (tungsten, full CTO)', role: 'background', kind: 'tungsten', gelStack: ['cto-full'], powerW: 650, circuit: 1, notes: 'Emulates the streetlight with warm gel, as crews do; real sodium cannot be matched.' },
				readings: [{ label: 'Window stand-in', time: '10:30', spectrum: tungstenSpectrum(3200, ['cto-full']), lux: 60 }]
			}
		],
		'2026-12-04'
	);
	await log.setTarget(dp, rebuild.setup.id, { kind: 'xy', x: Number(tubesOnLocation.x.toFixed(4)), y: Number(tubesOnLocation.y.toFixed(4)) }, 0.003, (await log.readSetup(dp, rebuild.setup.id))!.version);

	// A few review comments (inserted directly: the demo sends no mail).
	const note = (subjectType: 'setup' | 'light' | 'reading', subjectId: number, authorId: number, body: string, time: string) =>
		comments.create(project.id, { subjectType, subjectId, authorId, body, createdAt: new Date(time) });
	await note('setup', wide.setup.id, colorist.id, 'Matches the tubes nicely. The sodium in the window stays orange in the grade: that is the look.', at('2026-12-03', '14:00'));
	await note('light', wide.lights[4].id, colorist.id, '@Demo Gaffer the back reads a touch magenta next to the tubes: was the plus green on for every take?', at('2026-12-03', '14:05'));
	await note('light', wide.lights[4].id, gafferUser.id, 'Yes, from take 2 on (see the second reading).', at('2026-12-03', '15:30'));
	await note('reading', wide.lights[1].readings[0], colorist.id, 'Nearly one line at 589 nm: nothing to correct, only to keep off skin.', at('2026-12-03', '14:10'));
	await note('setup', window.setup.id, dpUser.id, 'The front socket shares a breaker with the dryers: run a cable from the back room before we light this.', at('2026-12-02', '19:00'));
}
