import { fail, redirect } from '@sveltejs/kit';
import { CredentialsSignin } from '@auth/sveltekit';
import { signIn } from '../../auth';
import { signInInput } from '$lib/schemas/auth';
import { parseForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

const MESSAGES: Record<string, string> = {
	credentials: 'Wrong e-mail or password.',
	rate_limited: 'Too many failed sign-in attempts from here. Wait a minute and try again, or sign in from a browser you have used before.'
};

/** Only a path on this site is a place to return to after sign-in. */
function safeReturn(target: string | null) {
	return target && target.startsWith('/') && !target.startsWith('//') ? target : '/';
}

export const load: PageServerLoad = ({ locals, url }) => {
	const redirectTo = safeReturn(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo);
	const error = url.searchParams.get('error');
	const code = url.searchParams.get('code') ?? 'credentials';
	return {
		redirectTo,
		message: error ? (MESSAGES[code] ?? MESSAGES.credentials) : null,
		notice: url.searchParams.get('reset') === '1' ? 'Your password was changed. Sign in with the new one.' : null
	};
};

export const actions: Actions = {
	default: async (event) => {
		const form = await event.request.clone().formData();
		const parsed = parseForm(form, signInInput);
		if (!parsed.ok) return fail(400, { errors: parsed.errors, values: parsed.values });
		try {
			// Auth.js checks the password, sets the session cookie and redirects.
			await signIn(event);
		} catch (err) {
			if (!(err instanceof CredentialsSignin)) throw err;
			const message = MESSAGES[err.code] ?? MESSAGES.credentials;
			return fail(400, { errors: { form: message }, values: { email: parsed.data.email } });
		}
	}
};
