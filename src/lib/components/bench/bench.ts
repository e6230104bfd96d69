/**
 * The setup bench's view model, shared by the page, its components and the polling endpoint: the
 * compact snapshot of one setup (target, lights, latest readings, distances), how lights sort by
 * distance, and the words and numbers a fix card shows. No DOM, no server imports.
 */
import type { ChartArrow, ChartReading, ChartTarget } from '$lib/components/charts/types';
import { domainAround, type Domain, type Plot } from '$lib/charts/viewport';

export interface BenchDistance {
	/** Δu′v′ to the target (CIE 1976 UCS). */
	duv_prime: number;
	/** Mired shift needed (+ warmer, − cooler). */
	mired: number | null;
	/** Duv needed (+ toward green, − toward magenta). */
	dDuv: number | null;
	within: boolean;
}

export interface BenchReading {
	id: number;
	label: string;
	x: number;
	y: number;
	u_prime: number;
	v_prime: number;
	cct_k: number | null;
	duv: number | null;
	ra: number | null;
	takenAt: string | null;
	createdAt: string;
	swatch: string | null;
	distance: BenchDistance | null;
}

export interface BenchLight {
	id: number;
	label: string;
	role: string;
	kind: string;
	kindLabel: string;
	fixtureProfile: string | null;
	gelText: string;
	ledText: string;
	heatCaution: string | null;
	/** Hot units (tungsten, HMI, practicals): gels on them need care. */
	hot: boolean;
	/** LED kinds with settable colour (not fixed white): an LED fix applies. */
	led: boolean;
	lastReading: BenchReading | null;
	latestFix: { kind: 'gel' | 'led'; setting: string; acceptedBy: string | null; acceptedAt: string } | null;
}

export interface BenchTarget {
	label: string;
	x: number;
	y: number;
	u_prime: number;
	v_prime: number;
	CCT: number | null;
	Duv: number | null;
	mired: number | null;
	tolerance: number;
	swatch: string | null;
	outOfGamut: boolean;
	warnings: string[];
}

export interface BenchCamera {
	kelvin: number | null;
	duv: number | null;
	tint: 'magenta' | 'green' | 'none';
	note: string;
}

export interface BenchSnapshot {
	/** Changes whenever anything shown changes (a hash of the rest). */
	version: string;
	setup: { id: number; name: string; status: string; statusLabel: string; version: number; targetLocked: boolean; locked: boolean; targetMissing: boolean; tolerance: number };
	target: BenchTarget | null;
	camera: BenchCamera | null;
	lights: BenchLight[];
}

/** Lights nearest the target first; lights without a distance (no reading, no target) last, in their order. */
export function sortByDistance<T extends Pick<BenchLight, 'lastReading'>>(lights: readonly T[]): T[] {
	return lights
		.map((l, i) => ({ l, i, d: l.lastReading?.distance?.duv_prime ?? null }))
		.sort((a, b) => {
			if (a.d === null && b.d === null) return a.i - b.i;
			if (a.d === null) return 1;
			if (b.d === null) return -1;
			return a.d - b.d || a.i - b.i;
		})
		.map((x) => x.l);
}

/** "on target" / "off target, 2.6 × the tolerance": the verdict in words, never colour alone. */
export function distanceVerdict(d: BenchDistance | null, tolerance: number): string {
	if (!d) return 'no distance yet';
	if (d.within) return 'on target (within tolerance)';
	const times = tolerance > 0 ? d.duv_prime / tolerance : Infinity;
	return Number.isFinite(times) ? `off target (${times.toFixed(1)} × the tolerance)` : 'off target';
}

/** Which way the light must go, in trade words: "needs warmer (CTO)", "needs plus green". */
export function directionWords(d: BenchDistance | null): string[] {
	if (!d || d.within) return [];
	const out: string[] = [];
	if (d.mired !== null && Math.abs(d.mired) >= 3) out.push(d.mired > 0 ? 'warmer (toward CTO)' : 'cooler (toward CTB)');
	if (d.dDuv !== null && Math.abs(d.dDuv) >= 0.001) out.push(d.dDuv > 0 ? 'plus green' : 'minus green');
	return out;
}

/** The chart's readings: each light's latest reading, labelled with the light, marked by role. */
export function chartReadings(lights: readonly BenchLight[]): ChartReading[] {
	return lights.filter((l) => l.lastReading).map((l) => ({ id: String(l.id), label: l.label, x: l.lastReading!.x, y: l.lastReading!.y, role: l.role }));
}

export function chartTarget(t: BenchTarget | null): ChartTarget | undefined {
	return t ? { x: t.x, y: t.y, tolerance: t.tolerance, label: 'Target white' } : undefined;
}

export interface ShownFix {
	label: string;
	predicted: { x: number; y: number };
}

/** Arrows from where the light is now to the predicted point of each shown fix. */
export function fixArrows(light: BenchLight | null | undefined, fixes: readonly ShownFix[]): ChartArrow[] {
	const r = light?.lastReading;
	if (!r) return [];
	return fixes.map((f) => ({ from: { x: r.x, y: r.y }, to: { x: f.predicted.x, y: f.predicted.y }, label: f.label }));
}

/** "updated just now", "updated 40 s ago", "updated 3 min ago". */
export function updatedAgo(thenMs: number, nowMs: number): string {
	const s = Math.max(0, Math.round((nowMs - thenMs) / 1000));
	if (s < 10) return 'updated just now';
	if (s < 60) return `updated ${s} s ago`;
	return `updated ${Math.floor(s / 60)} min ago`;
}

/** Light lost through a filter, in stops, to the nearest tenth: "0.7 stop". */
export function fmtStops(stops: number | null | undefined): string {
	if (stops == null || !Number.isFinite(stops)) return '—';
	const r = Math.round(stops * 10) / 10;
	return `${r.toFixed(1)}\u00a0stop${r === 1 ? '' : 's'}`;
}

/** A share as a whole percentage: "82 %". */
export function fmtPercent(share: number | null | undefined): string {
	if (share == null || !Number.isFinite(share)) return '—';
	return `${Math.round(share * 100)}\u00a0%`;
}

/** A channel level in percent to one decimal: "63.5 %". */
export function fmtLevel(percent: number): string {
	return `${(Math.round(percent * 10) / 10).toFixed(1)}\u00a0%`;
}

// ——— Fix results as the fixes API returns them (the parts the bench reads) ———

interface Predicted {
	x: number;
	y: number;
	u_prime?: number;
	v_prime?: number;
	CCT: number | null;
	Duv: number | null;
	mired?: number | null;
	Ra: number | null;
	SSI?: number | null;
}

export interface GelProposalView {
	rank: number;
	gels: Array<{ id: string; label: string }>;
	label: string;
	predicted: Predicted;
	residual: number;
	within: boolean;
	lossStops: number;
	miredShift: { nominal: number; actual: number | null };
	estimate: boolean;
}

export interface GelResultView {
	estimate: boolean;
	note: string;
	cautions: string[];
	warnings: string[];
	before: BenchDistance;
	proposals: GelProposalView[];
}

export interface LedChannelView {
	id: string;
	label: string;
	level: number;
	percent: number;
	dmx8: number;
	dmx16: { value: number; coarse: number; fine: number };
}

export interface LedResultView {
	fixture: { id: string; label: string; kind: string; generic: boolean };
	inGamut: boolean;
	note: string;
	channels: LedChannelView[];
	predicted: Predicted;
	relativeOutput: number;
	distance: BenchDistance;
	bicolour: { cctSettingK: number | null; mixDuv: number | null; greenMagentaDuv: number | null; note: string } | null;
	cautions: string[];
	warnings: string[];
	quality?: { metric: 'Ra' | 'SSI'; value: number; atMaximumOutput: number; outputShare: number; minOutput: number };
}

/** The body to accept a gel proposal (POST …/lights/:id/fixes). */
export function gelAcceptBody(p: GelProposalView) {
	return { kind: 'gel' as const, fix: { stack: p.gels.map((g) => g.id) }, predicted: { x: p.predicted.x, y: p.predicted.y, CCT: p.predicted.CCT, Duv: p.predicted.Duv, Ra: p.predicted.Ra, residual: p.residual, lossStops: p.lossStops } };
}

/** The body to accept an LED fix: levels per channel in percent, and the bi-colour CCT and green/magenta where there are two channels. */
export function ledAcceptBody(f: LedResultView) {
	const levels = Object.fromEntries(f.channels.map((c) => [c.id, Math.min(100, Math.max(0, Math.round(c.percent * 10) / 10))]));
	const fix: Record<string, unknown> = { levels };
	if (f.bicolour?.cctSettingK != null) fix.cct_k = Math.round(f.bicolour.cctSettingK);
	if (f.bicolour?.greenMagentaDuv != null) fix.gm = f.bicolour.greenMagentaDuv;
	return { kind: 'led' as const, fix, predicted: { x: f.predicted.x, y: f.predicted.y, CCT: f.predicted.CCT, Duv: f.predicted.Duv, Ra: f.predicted.Ra, residual: f.distance.duv_prime, fixture: f.fixture.id } };
}

/**
 * The chart's first view: centred on the readings and the target, wide enough for all of them with
 * a margin (at least 0.08 in x so the Planckian locus reads as a curve), never wider than the chart.
 */
export function chartHome(points: readonly { x: number; y: number }[], plot: Plot, full: Domain): Domain {
	if (points.length === 0) return full;
	const xs = points.map((p) => p.x);
	const ys = points.map((p) => p.y);
	const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
	const inner = { w: plot.width - plot.margin.left - plot.margin.right, h: plot.height - plot.margin.top - plot.margin.bottom };
	const width = Math.min(full.x1 - full.x0, Math.max(0.08, (x1 - x0) * 1.6, ((y1 - y0) * 1.6 * inner.w) / inner.h));
	return domainAround({ x: (x0 + x1) / 2, y: (y0 + y1) / 2 }, width, plot);
}
