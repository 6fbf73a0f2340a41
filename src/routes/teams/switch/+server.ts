import { redirect } from '@sveltejs/kit';
import { TEAM_COOKIE } from '$lib/server/auth/account';
import { requireTeam } from '$lib/server/permissions';
import type { RequestHandler } from './$types';

// Chooses the current team (a form post from the top bar's team switcher).
export const POST: RequestHandler = async (event) => {
	const form = await event.request.formData();
	const teamId = String(form.get('teamId') ?? '');
	const team = requireTeam(event, 'view', teamId);
	event.cookies.set(TEAM_COOKIE, team.id, { path: '/', httpOnly: true, sameSite: 'lax', secure: event.url.protocol === 'https:', maxAge: 365 * 24 * 3600 });
	const back = String(form.get('back') ?? '/');
	// Object pages belong to one team: after a switch, go to the dashboard unless we were already there.
	redirect(303, back.startsWith('/cars/') || !back.startsWith('/') || back.startsWith('//') ? '/' : back);
};
