import { fail, redirect } from '@sveltejs/kit';
import { signIn } from '../../auth';
import { signUpInput } from '$lib/schemas/auth';
import { hashPassword } from '$lib/server/auth/passwords';
import { db } from '$lib/server/db';
import { recordAudit } from '$lib/server/db/queries/audit';
import { createUserWithTeam } from '$lib/server/db/queries/users';
import { parseForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = ({ locals }) => {
	if (locals.user) redirect(303, '/');
};

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.clone().formData();
		const parsed = parseForm(form, signUpInput);
		if (!parsed.ok) return fail(400, { errors: parsed.errors, values: parsed.values });
		const { name, email, password, teamName } = parsed.data;
		const created = await createUserWithTeam(db, { name, email, teamName, passwordHash: await hashPassword(password) });
		if (!created) {
			return fail(400, {
				errors: { email: 'An account with this e-mail already exists. Sign in instead.' },
				values: { name, email, teamName }
			});
		}
		await recordAudit(db, { teamId: created.teamId, actorId: created.user.id, action: 'team.created', subjectType: 'team', subjectId: created.teamId });
		await signIn(event);
	}
};
