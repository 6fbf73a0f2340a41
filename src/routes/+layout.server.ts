import type { LayoutServerLoad } from './$types';

// Display data only: who is signed in and their teams. Each page checks permissions itself.
export const load: LayoutServerLoad = ({ locals }) => ({
	user: locals.user,
	teams: locals.teams.map((t) => ({ id: t.id, name: t.name, role: t.role })),
	team: locals.team ? { id: locals.team.id, name: locals.team.name, role: locals.team.role } : null
});
