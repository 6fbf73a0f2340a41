import { fail, redirect } from '@sveltejs/kit';
import { cornerInput } from '$lib/schemas/corner';
import { measureWords, TARGET_MEASURES, targetSchema, targetsSchema } from '$lib/schemas/targets';
import { mmPer } from '$lib/units';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { cornersOfCar, createCorner } from '$lib/server/db/queries/corners';
import { setCarTargets } from '$lib/server/db/queries/cars';
import { parseForm } from '$lib/server/forms';
import { can, requireCar } from '$lib/server/permissions';
import { scansOfCar } from '$lib/server/db/queries/scans';
import { sweepScans } from '$lib/server/scans/process';
import { scanView } from '$lib/server/scans/scans';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { car, role } = await requireCar(event, event.params.carId, 'view');
	await sweepScans();
	const [corners, scans] = await Promise.all([cornersOfCar(db, car.id), scansOfCar(db, car.id)]);
	return { car, targets: targetsSchema.catch([]).parse(car.targets), corners, scans: scans.map(scanView), canEdit: can(role, 'edit') };
};

/** Numbers from the target form; a decimal comma is accepted. */
const numberFields = ['min', 'max', 'from', 'to'] as const;

export const actions: Actions = {
	addTarget: async (event) => {
		const { car } = await requireCar(event, event.params.carId, 'edit');
		const form = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		const raw: Record<string, unknown> = { ...form };
		for (const k of numberFields) raw[k] = form[k] === undefined || form[k].trim() === '' ? undefined : Number(form[k].replace(',', '.'));
		// typed in the user's length unit: the travel range, and the band of a length measure; stored in mm
		const per = mmPer(event.locals.user?.lengthUnit ?? 'mm');
		const lengthBand = (TARGET_MEASURES as readonly string[]).includes(form.measure) && measureWords(form.measure as (typeof TARGET_MEASURES)[number]).unit === 'mm';
		for (const k of lengthBand ? numberFields : (['from', 'to'] as const)) if (typeof raw[k] === 'number') raw[k] = (raw[k] as number) * per;
		const parsed = targetSchema.safeParse(raw);
		if (!parsed.success) return fail(400, { targetError: `${parsed.error.issues[0].path.join('.')}: ${parsed.error.issues[0].message}` });
		const targets = [...targetsSchema.catch([]).parse(car.targets), parsed.data];
		await setCarTargets(db, car.id, targets);
		await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'car.targets_changed', subjectType: 'car', subjectId: car.id });
		return { targetSaved: true };
	},
	removeTarget: async (event) => {
		const { car } = await requireCar(event, event.params.carId, 'edit');
		// A missing index is not target 0: only a whole number that was sent removes a target.
		const raw = (await event.request.formData()).get('index');
		const index = typeof raw === 'string' && /^\d+$/.test(raw.trim()) ? Number(raw) : NaN;
		const targets = targetsSchema.catch([]).parse(car.targets);
		if (!Number.isInteger(index) || index < 0 || index >= targets.length) return fail(400, { targetError: 'That target is no longer there.' });
		targets.splice(index, 1);
		await setCarTargets(db, car.id, targets);
		await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'car.targets_changed', subjectType: 'car', subjectId: car.id });
		return { targetSaved: true };
	},
	addCorner: async (event) => {
		const { car } = await requireCar(event, event.params.carId, 'edit');
		const parsed = parseForm(await event.request.formData(), cornerInput);
		if (!parsed.ok) return fail(400, { errors: parsed.errors });
		const corner = await createCorner(db, car.id, parsed.data.position, parsed.data.kind);
		if (!corner) return fail(400, { errors: { position: 'This car already has that corner.' } });
		await recordAudit(db, { teamId: car.teamId, actorId: event.locals.user!.id, action: 'corner.created', subjectType: 'corner', subjectId: corner.id, detail: { position: corner.position } });
		redirect(303, `/corners/${corner.id}`);
	}
};
