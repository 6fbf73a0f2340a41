// See https://svelte.dev/docs/kit/types#app.d.ts
import type { TeamRole } from '$lib/server/db/queries/users';

declare global {
	namespace App {
		interface Error {
			message: string;
			code?: string;
			field?: string;
		}
		interface Locals {
			user: { id: string; email: string; name: string; lengthUnit: 'mm' | 'in' } | null;
			teams: TeamRole[];
			team: TeamRole | null;
			/** a known-device token to set on this response (after a successful sign-in) */
			deviceCookie?: string;
			/** Set by handleError when the database could not be reached: the answer becomes a 503. */
			unavailable?: boolean;
		}
		interface PageData {
			user?: { id: string; email: string; name: string; lengthUnit: 'mm' | 'in' } | null;
		}
	}
}

export {};
