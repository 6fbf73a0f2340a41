// Frame: ISO 8855 vehicle axes, x forward, y left, z up; mm at 0.1 on the sheet.
// A share link to one axle of one car revision (scope 'axle'): both sides' pickup points (the right side as
// measured or mirrored from the left), a solid axle's points, the steering and anti-roll bar points, and the axle's
// figures, for the fabricator who builds or checks the whole axle. Everything comes from the one car revision and
// the corner revisions it pins; nothing else of the team is read. Readers are few, so each opening is built anew.
import { error, type RequestEvent } from '@sveltejs/kit';
import { describeKeepOut } from '$lib/schemas/keep-out';
import { joinRocker, tablePoints } from '$lib/kinds';
import { mirrorCorner } from '$lib/schemas/axle';
import type { CreateAxleShareInput } from '$lib/schemas/share';
import { hashToken, newToken } from '$lib/server/auth/tokens';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { axleShareToOpen, createAxleShareLink, sharesOfCarRevision } from '$lib/server/db/queries/shares';
import type { Car, CarRevision } from '$lib/server/db/schema';
import { absoluteUrl } from '$lib/server/urls';
import { axleSweep, figuresOrInvalid, loadCarRevision } from '$lib/server/cars/model';
import { recordShareOpen } from './opens';
import { limitOpenings, refuseClosedLink } from './sheet';
import { linkStatus, withPending } from './shares';

const DAY_MS = 24 * 3600 * 1000;
export const AXLE_LABELS = { front: 'Front axle', rear: 'Rear axle' } as const;

/** Creates a link to one axle of a car revision; the caller has checked the 'share' permission on it. */
export async function createAxleShare(event: Pick<RequestEvent, 'url'>, target: { car: Car; carRevision: CarRevision }, actor: { id: string }, input: CreateAxleShareInput) {
	const token = newToken();
	const expiresAt = new Date(Date.now() + input.expiresInDays * DAY_MS);
	const link = await createAxleShareLink(db, {
		teamId: target.car.teamId,
		carRevisionId: target.carRevision.id,
		axle: input.axle,
		tokenHash: hashToken(token),
		note: input.note,
		showRevisionNote: false,
		expiresAt,
		createdBy: actor.id
	});
	await recordAudit(db, {
		teamId: target.car.teamId,
		actorId: actor.id,
		action: 'share.created',
		subjectType: 'share_link',
		subjectId: link.id,
		detail: { car: target.car.name, carRevision: target.carRevision.number, carRevisionId: target.carRevision.id, axle: input.axle, expiresAt: expiresAt.toISOString() }
	});
	return { id: link.id, url: absoluteUrl(event, `/s/axle/${token}`), axle: input.axle, expiresAt };
}

/** A car revision's axle links with their status (never the token). */
export async function listAxleShares(carRevisionId: string) {
	const now = Date.now();
	return (await sharesOfCarRevision(db, carRevisionId)).map((s) => ({ ...s, ...withPending(s), status: linkStatus(s, now) }));
}

/** The link behind a token, counted as opened unless count is false: 404 unknown or revoked, 410 expired, 429 too often. */
export async function openAxleShare(token: string, clientAddress: string, { count = true } = {}) {
	const found = await axleShareToOpen(db, hashToken(token));
	refuseClosedLink(found?.share);
	limitOpenings(found!.share.id, clientAddress);
	if (count) recordShareOpen(found.share.id, found.share.teamId, { carRevisionId: found.carRevision.id, carRevision: found.carRevision.number, car: found.car.name, axle: found.share.axle });
	return found;
}

export interface AxlePointRow {
	side: 'left' | 'right' | 'axle';
	name: string;
	label: string;
	xyz: [number, number, number];
}

/** What the axle sheet shows. */
export async function buildAxleSheet(opened: NonNullable<Awaited<ReturnType<typeof axleShareToOpen>>>) {
	const { car, carRevision, share } = opened;
	const axle = share.axle!;
	const { model, corners } = await loadCarRevision(carRevision);
	const settings = model[axle];
	const rows: AxlePointRow[] = [];
	let kind = 'solid_axle';
	let mirrored = false;
	if (axle === 'rear' && settings.solid) {
		for (const [name, p] of Object.entries(settings.solid.points)) rows.push({ side: 'axle', name, label: name.replace(/_/g, ' ').replace('.', ', '), xyz: p as [number, number, number] });
	} else {
		const left = corners[`${axle}_left`];
		if (!left) error(404, { message: 'This car revision has no corner on that axle any more.', code: 'not_found' });
		const measured = settings.right === 'measured' ? corners[`${axle}_right`] : undefined;
		const right = measured ?? mirrorCorner(left);
		mirrored = !measured;
		kind = left.kind;
		for (const [side, c] of [['left', left], ['right', right]] as const) {
			const points = joinRocker(c.points, c.rocker);
			for (const spec of tablePoints(c.kind, !!c.rocker)) {
				const p = points[spec.name];
				if (p) rows.push({ side, name: spec.name, label: spec.label, xyz: p });
			}
		}
	}
	const bar = settings.anti_roll_bar ?? null;
	if (bar) {
		const m = (p: [number, number, number]): [number, number, number] => [p[0], -p[1], p[2]];
		rows.push(
			{ side: 'left', name: 'bar.pivot', label: 'Anti-roll bar bearing', xyz: bar.pivot },
			{ side: 'left', name: 'bar.arm_end', label: 'Anti-roll bar lever end', xyz: bar.arm_end },
			{ side: 'left', name: 'bar.link_end', label: `Drop link on the ${bar.link_on}`, xyz: bar.link_end },
			{ side: 'right', name: 'bar.pivot', label: 'Anti-roll bar bearing', xyz: m(bar.pivot) },
			{ side: 'right', name: 'bar.arm_end', label: 'Anti-roll bar lever end', xyz: m(bar.arm_end) },
			{ side: 'right', name: 'bar.link_end', label: `Drop link on the ${bar.link_on}`, xyz: m(bar.link_end) }
		);
	}
	let figures: { track: number; rcHeight: number | null; wheelRate: number; motionRatio: number | null } | null = null;
	let steering: { perTurn: number; lock: { steeringWheel: number; left: number | null; right: number | null; ackermann: number | null; /** diameter, m (contract) */ turningCircle: number | null }[]; ratio: number | null } | null = null;
	let problem: string | null = null;
	try {
		const f = figuresOrInvalid(model, corners).axles[axle];
		figures = { track: f.track, rcHeight: f.rc_height, wheelRate: f.wheel_rate_left, motionRatio: f.motion_ratio_left };
		if (settings.steering && !(axle === 'rear' && settings.solid)) {
			const s = axleSweep(car, model, corners, axle, { sweep: 'steer', from: -360, to: 360, step: 180 });
			const samples = s.samples as { steering_wheel: number; delta_left: number | null; delta_right: number | null; ackermann: number | null; steering_ratio: number | null; turning_circle: number | null }[];
			steering = {
				perTurn: settings.steering.rack_travel_per_turn,
				lock: samples.filter((x) => x.steering_wheel !== 0).map((x) => ({ steeringWheel: x.steering_wheel, left: x.delta_left, right: x.delta_right, ackermann: x.ackermann, turningCircle: x.turning_circle })),
				ratio: samples.find((x) => x.steering_wheel === 0)?.steering_ratio ?? null
			};
		}
	} catch (e) {
		problem = e && typeof e === 'object' && 'body' in e ? String((e as { body: { message: string } }).body.message) : 'The axle cannot be analysed as saved.';
	}
	return {
		car: { name: car.name },
		carRevision: { number: carRevision.number, label: carRevision.label, createdAt: carRevision.createdAt },
		axle,
		axleLabel: AXLE_LABELS[axle],
		kind,
		mirrored,
		rows,
		figures,
		steering,
		problem,
		keepOut: (model.keep_out ?? []).filter((v) => v.shape !== 'rim' || v.axle === axle).map((v) => ({ name: v.name, text: describeKeepOut(v) })),
		note: share.note,
		expiresAt: share.expiresAt
	};
}

/** The axle sheet's points as CSV: side, point, description, x, y, z (mm at 0.1, ISO 8855 vehicle axes). */
/** The axle sheet's points as CSV (in sheet-csv.ts: pure, tested without a database). */
export { axleSheetCsv } from './sheet-csv';
