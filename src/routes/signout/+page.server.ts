import { signOut } from '../../auth';
import type { Actions } from './$types';

// Every sign-out form posts redirectTo=/signin; Auth.js clears the session cookie.
export const actions: Actions = { default: signOut };
