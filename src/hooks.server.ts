// Request pipeline: Auth.js, then the caller's account, teams and current team.
import { sequence } from '@sveltejs/kit/hooks';
import type { Handle, HandleServerError } from '@sveltejs/kit';
import { handle as authHandle } from './auth';
import { loadAccount } from '$lib/server/auth/account';
import { authGuard } from '$lib/server/auth/guard';
import { installShutdown } from '$lib/server/lifecycle';

installShutdown();

const accountHandle: Handle = async ({ event, resolve }) => {
	await loadAccount(event);
	return resolve(event);
};

export const handle = sequence(authGuard, authHandle, accountHandle);

export const handleError: HandleServerError = ({ error, status, message }) => {
	if (status >= 500) console.error(error);
	return { message: status >= 500 ? 'Something went wrong on the server. Try again.' : message, code: 'server_error' };
};
