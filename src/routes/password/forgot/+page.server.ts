import { fail } from '@sveltejs/kit';
import { forgotInput } from '$lib/schemas/password';
import { requestPasswordReset } from '$lib/server/auth/password-reset';
import { parseForm } from '$lib/server/forms';
import type { Actions } from './$types';

export const actions: Actions = {
	default: async (event) => {
		const parsed = parseForm(await event.request.formData(), forgotInput);
		if (!parsed.ok) return fail(400, { errors: parsed.errors, values: parsed.values });
		const outcome = await requestPasswordReset(event, parsed.data.email);
		if (!outcome.ok) return fail(outcome.message.startsWith('Too many') ? 429 : 502, { errors: { form: outcome.message }, values: { email: parsed.data.email } });
		return { sent: parsed.data.email };
	}
};
