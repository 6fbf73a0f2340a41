import { error, fail, redirect } from '@sveltejs/kit';
import { resetInput } from '$lib/schemas/password';
import { findReset, resetPassword } from '$lib/server/auth/password-reset';
import { parseForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

const GONE = 'This reset link has expired or was already used. Ask for a new one.';

export const load: PageServerLoad = async (event) => {
	// same-origin, not no-referrer: with no-referrer the browser sends "Origin: null" on the form post, which the CSRF check refuses.
	event.setHeaders({ 'referrer-policy': 'same-origin', 'cache-control': 'private, no-store' });
	const reset = await findReset(event.params.token);
	if (!reset) error(410, { message: GONE, code: 'expired' });
	return { email: reset.email };
};

export const actions: Actions = {
	default: async (event) => {
		const parsed = parseForm(await event.request.formData(), resetInput);
		if (!parsed.ok) return fail(400, { errors: parsed.errors });
		if (!(await resetPassword(event.params.token, parsed.data.password))) return fail(410, { errors: { form: GONE } });
		redirect(303, '/signin?reset=1');
	}
};
