import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { IMPORT_LIMITS } from '$lib/schemas/import';
import { endpoint, invalid, parseWith, refuseIfTooLarge } from '$lib/server/api';
import { runImport } from '$lib/server/corners/import';
import { requireCorner } from '$lib/server/permissions';
import type { RequestEvent } from './$types';

const fields = z.object({
	dryRun: z.enum(['true', 'false'], { message: "dryRun must be 'true' or 'false'" }).default('false'),
	label: z.string().max(120, 'label is at most 120 characters').default(''),
	note: z.string().max(5000, 'note is at most 5000 characters').default(''),
	loadedRadius: z.coerce.number({ message: 'loadedRadius must be a number (mm)' }).positive('loadedRadius must be > 0').optional(),
	springOn: z.enum(['lower', 'upper', 'upright'], { message: "springOn must be 'lower', 'upper' or 'upright'" }).optional()
});

// Multipart: file (the CSV), options (JSON of the import options), dryRun, label, note, loadedRadius?, springOn?.
export const POST = endpoint<RequestEvent>(async (event) => {
	const { corner, car } = await requireCorner(event, event.params.cornerId, 'edit');
	const type = event.request.headers.get('content-type')?.split(';', 1)[0].trim().toLowerCase() ?? '';
	if (type !== 'multipart/form-data') {
		error(415, { message: `Send multipart/form-data with a file field and an options field (got ${type || 'no content type'})`, code: 'unsupported_media_type', field: 'content-type' });
	}
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch (e) {
		refuseIfTooLarge(e);
		invalid('', 'Send multipart/form-data with a file field and an options field', 'invalid_form');
	}
	const file = form.get('file');
	if (!(file instanceof File)) invalid('file', 'attach the CSV file as the "file" field');
	let options: unknown = {};
	const rawOptions = form.get('options');
	if (typeof rawOptions === 'string' && rawOptions.trim() !== '') {
		try {
			options = JSON.parse(rawOptions);
		} catch {
			invalid('options', 'not valid JSON');
		}
	}
	const entries = Object.fromEntries([...form].filter(([k, v]) => typeof v === 'string' && k !== 'options' && (v as string) !== ''));
	const f = parseWith(fields, entries);
	if (file.size > IMPORT_LIMITS.maxFileBytes * 4) invalid('file', `the file is ${(file.size / 1048576).toFixed(1)} MB; the limit is 5 MB`, 'file_too_large');
	const result = await runImport({
		car, corner, userId: event.locals.user!.id, file, options, dryRun: f.dryRun === 'true',
		label: f.label, note: f.note, loadedRadius: f.loadedRadius, springOn: f.springOn
	});
	return json(result.saved ? { ...result.saved, preview: result.preview } : { preview: result.preview, geometry: result.geometry }, { status: result.saved ? 201 : 200 });
});
