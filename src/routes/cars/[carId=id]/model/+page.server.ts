import { fail, redirect } from '@sveltejs/kit';
import { carRevisionInput, starterModel, type CarModel } from '$lib/schemas/car-model';
import { db } from '$lib/server/db';
import { carRevisionOfCar, carRevisionsOfCar, latestCornerRevisions } from '$lib/server/db/queries/car-revisions';
import { listAxleShares } from '$lib/server/sharing/axle-sheet';
import { carPitchSweep, figuresOrInvalid, loadCarRevision, saveCarRevision } from '$lib/server/cars/model';
import { can, requireCar } from '$lib/server/permissions';
import { isHttpError } from '@sveltejs/kit';
import { changesBetween, type CarChange } from '$lib/server/cars/compare';
import { carScene, rollPaths, steerFrames, type SteerSample } from '$lib/server/cars/scene';
import type { Actions, PageServerLoad } from './$types';

type Figures = ReturnType<typeof figuresOrInvalid>;
/** The charts' data of a revision: the steered axle through the steering range, both axles' roll-centre paths. */
type Axles = { steer: { error: unknown; kinds: string[]; samples: SteerSample[] } | null; roll: ReturnType<typeof rollPaths> };

/** Figures, or the message naming what stops them. */
function tryFigures<T>(f: () => T): { ok: true; value: T } | { ok: false; message: string } {
	try {
		return { ok: true, value: f() };
	} catch (e) {
		if (isHttpError(e)) return { ok: false, message: e.body.message };
		throw e;
	}
}

export const load: PageServerLoad = async (event) => {
	const { car, role } = await requireCar(event, event.params.carId, 'view');
	const rev = event.url.searchParams.get('rev');
	const [list, row, latestCorners] = await Promise.all([carRevisionsOfCar(db, car.id), carRevisionOfCar(db, car.id, rev && /^[0-9a-f-]{36}$/i.test(rev) ? rev : null), latestCornerRevisions(db, car.id)]);
	const positions = Object.keys(latestCorners);
	if (!row) {
		return { car, canEdit: can(role, 'edit'), revisions: list, current: null, model: starterModel(car.wheelbaseMm ?? 2600, car.cgHeightMm ?? 400), positions, figures: null, compare: null, axles: null, scene: null, sceneError: null, pitch: null, axleShares: [] };
	}
	const vsId = event.url.searchParams.get('vs') ?? row.parentId;
	const [loaded, vsRow] = await Promise.all([loadCarRevision(row), vsId && /^[0-9a-f-]{36}$/i.test(vsId) ? carRevisionOfCar(db, car.id, vsId) : Promise.resolve(null)]);
	const figures = tryFigures(() => figuresOrInvalid(loaded.model, loaded.corners));
	let compare: { number: number; label: string; id: string; figures: Figures | null; axles: Axles | null; changes: CarChange[] } | null = null;
	if (vsRow && vsRow.id !== row.id) {
		const other = await loadCarRevision(vsRow);
		const f = tryFigures(() => figuresOrInvalid(other.model, other.corners));
		const axles = f.ok ? tryFigures(() => ({ steer: steerFrames(car, other.model, other.corners, false), roll: rollPaths(car, other.model, other.corners) })) : null;
		compare = { number: vsRow.number, label: vsRow.label, id: vsRow.id, figures: f.ok ? f.value : null, axles: axles?.ok ? axles.value : null, changes: await changesBetween(vsRow, row) };
	}
	const steer = figures.ok ? steerFrames(car, loaded.model, loaded.corners, true) : null;
	const axles: Axles | null = figures.ok ? { steer: steer && { ...steer, samples: steer.samples.map(({ left: _l, right: _r, ...s }) => s) }, roll: rollPaths(car, loaded.model, loaded.corners) } : null;
	const scene = figures.ok ? tryFigures(() => carScene(car, loaded.model, loaded.corners, figures.value, steer)) : null;
	// the whole car pitched about its CG: anti-dive and anti-squat through ±2° (+ = nose down)
	const pitchRun = figures.ok ? tryFigures(() => carPitchSweep(car, loaded.model, loaded.corners, { from: -2, to: 2, step: 0.25 })) : null;
	const axleShares = can(role, 'share') ? await listAxleShares(row.id) : [];
	const pitch = pitchRun?.ok ? pitchRun.value.samples.map((x) => ({ pitch: x.pitch, front: x.front.anti, rear: x.rear.anti, frontTravel: x.front.travel, rearTravel: x.rear.travel })) : null;
	return {
		car,
		canEdit: can(role, 'edit'),
		revisions: list,
		current: { id: row.id, number: row.number, label: row.label, note: row.note, createdAt: row.createdAt, corners: row.cornerRevisions },
		model: loaded.model as CarModel,
		positions,
		figures: figures.ok ? figures.value : null,
		figuresError: figures.ok ? null : figures.message,
		compare,
		axles,
		scene: scene?.ok ? scene.value : null,
		pitch,
		axleShares,
		sceneError: scene && !scene.ok ? scene.message : null
	};
};

export const actions: Actions = {
	save: async (event) => {
		const { car } = await requireCar(event, event.params.carId, 'edit');
		const form = await event.request.formData();
		let model: unknown;
		try {
			model = JSON.parse(String(form.get('model') ?? ''));
		} catch {
			return fail(400, { error: 'model: the form did not send a car model' });
		}
		const parsed = carRevisionInput.safeParse({ label: form.get('label') ?? '', note: form.get('note') ?? '', model });
		if (!parsed.success) {
			const issue = parsed.error.issues[0];
			return fail(400, { error: `${issue.path.join('.')}: ${issue.message}`, field: issue.path.join('.') });
		}
		const parent = await carRevisionOfCar(db, car.id, null);
		let saved;
		try {
			saved = await saveCarRevision(car, event.locals.user!.id, parsed.data, parent?.id ?? null);
		} catch (e) {
			if (isHttpError(e) && e.status === 400) return fail(400, { error: e.body.message, field: (e.body as { field?: string }).field });
			throw e;
		}
		redirect(303, `/cars/${car.id}/model?rev=${saved.revision.id}`);
	}
};
