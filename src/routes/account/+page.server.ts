import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { hashToken, newToken } from '$lib/server/auth/tokens';
import { db } from '$lib/server/db';
import { openSessionCount, revokeSessionsOfUser } from '$lib/server/db/queries/sessions';
import { apiTokensOfUser, createApiToken, revokeApiToken, setLengthUnit } from '$lib/server/db/queries/users';
import { requireUser } from '$lib/server/permissions';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const [tokens, sessions] = await Promise.all([apiTokensOfUser(db, user.id), openSessionCount(db, user.id)]);
	return { tokens, sessions };
};

const createForm = z.object({ name: z.string().trim().min(1, 'Give the token a name').max(80, 'Name is at most 80 characters') });

const unitForm = z.object({ unit: z.enum(['mm', 'in'], { message: 'unit: choose millimetres or inches' }) });

export const actions: Actions = {
	setUnit: async (event) => {
		const user = requireUser(event);
		const parsed = unitForm.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { error: parsed.error.issues[0].message });
		await setLengthUnit(db, user.id, parsed.data.unit);
		return { unit: parsed.data.unit };
	},
	createToken: async (event) => {
		const user = requireUser(event);
		const parsed = createForm.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { error: parsed.error.issues[0].message });
		const token = newToken('lw_');
		await createApiToken(db, user.id, parsed.data.name, hashToken(token));
		// Shown once: only its hash is stored.
		return { created: { name: parsed.data.name, token } };
	},
	revokeToken: async (event) => {
		const user = requireUser(event);
		const id = String((await event.request.formData()).get('tokenId') ?? '');
		if (!z.string().uuid().safeParse(id).success || !(await revokeApiToken(db, user.id, id))) {
			return fail(400, { error: 'That token is not one of yours, or is already revoked.' });
		}
		return { revoked: id };
	},
	signOutEverywhere: async (event) => {
		const user = requireUser(event);
		await revokeSessionsOfUser(db, user.id);
		// this browser's session ended with the others: its cookie goes too
		for (const name of ['authjs.session-token', '__Secure-authjs.session-token']) event.cookies.delete(name, { path: '/' });
		redirect(303, '/signin');
	}
};
