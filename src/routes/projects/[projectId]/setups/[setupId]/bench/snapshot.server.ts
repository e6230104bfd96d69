/**
 * The setup bench's snapshot: the setup's target white (with the camera white balance that
 * neutralises it), every light with its latest reading and distance, and its accepted fix, plus a
 * version that changes only when something shown changes. Used by the bench page's load and by the
 * polling endpoint, so both agree.
 */
import { createHash } from 'node:crypto';
import { displaySwatch } from '$lib/colour';
import { cameraWhiteBalance, type TargetWhite } from '$lib/matching';
import type { ProjectAccess } from '$lib/server/authz';
import * as log from '$lib/server/services/log';
import { sortByDistance, type BenchLight, type BenchSnapshot, type BenchTarget } from '$lib/components/bench/bench';

const HOT = new Set(['tungsten', 'hmi', 'practical']);

function outOfGamut(x: number, y: number): boolean {
	try {
		return displaySwatch({ x, y }).outOfGamut;
	} catch {
		return true;
	}
}

const iso = (t: Date | string | null | undefined) => (t == null ? null : t instanceof Date ? t.toISOString() : new Date(t).toISOString());

type SetupView = NonNullable<Awaited<ReturnType<typeof log.setupPage>>>;

export function snapshotOf(view: SetupView): BenchSnapshot {
	const s = view.setup;
	const t = s.target;
	const target: BenchTarget | null = t
		? { label: t.label, x: t.x, y: t.y, u_prime: t.u_prime, v_prime: t.v_prime, CCT: t.CCT, Duv: t.Duv, mired: t.mired, tolerance: t.tolerance, swatch: t.swatch, outOfGamut: outOfGamut(t.x, t.y), warnings: t.warnings }
		: null;
	// cameraWhiteBalance reads only the target's CCT and Duv.
	const cam = t ? cameraWhiteBalance({ CCT: t.CCT, Duv: t.Duv } as TargetWhite) : null;
	const lights: BenchLight[] = view.lights.map((l) => {
		const r = l.lastReading;
		return {
			id: l.id,
			label: l.label,
			role: l.role,
			kind: l.kind,
			kindLabel: l.kindLabel,
			fixtureProfile: l.fixtureProfile,
			gelText: l.gelText,
			ledText: l.ledText,
			heatCaution: l.heatCaution,
			hot: HOT.has(l.kind),
			// A fixed-white LED has no colour to set: gels are its fixes.
			led: l.kind.startsWith('led') && l.kind !== 'led-white',
			lastReading: r
				? { id: r.id, label: r.label, x: r.x, y: r.y, u_prime: r.u_prime, v_prime: r.v_prime, cct_k: r.cct_k, duv: r.duv, ra: r.ra, takenAt: iso(r.takenAt), createdAt: iso(r.createdAt) ?? '', swatch: r.swatch, distance: r.distance }
				: null,
			latestFix: l.latestFix ? { kind: l.latestFix.kind, setting: l.latestFix.setting, acceptedBy: l.latestFix.acceptedBy, acceptedAt: iso(l.latestFix.acceptedAt) ?? '' } : null
		};
	});
	const body = {
		setup: { id: s.id, name: s.name, status: s.status, statusLabel: s.statusLabel, version: s.version, targetLocked: Boolean(s.targetLocked), locked: Boolean(s.locked), targetMissing: s.targetMissing, tolerance: s.targetTolerance },
		target,
		camera: cam ? { kelvin: cam.kelvin, duv: cam.duv, tint: cam.tint, note: cam.note } : null,
		lights: sortByDistance(lights)
	};
	const version = createHash('sha1').update(JSON.stringify(body)).digest('hex').slice(0, 16);
	return { version, ...body };
}

/** The setup page's view and the bench snapshot of it (null: no such setup in this project). */
export async function benchOf(access: ProjectAccess, setupId: number) {
	const view = await log.setupPage(access, setupId);
	return view ? { view, snapshot: snapshotOf(view) } : null;
}
