// Forgotten password: ask for a link, then set a new password.
import { z } from 'zod';
import { email } from './auth';

export const forgotInput = z.object({ email });

export const resetInput = z
	.object({
		password: z.string().min(10, 'Password must be at least 10 characters').max(200, 'Password is too long'),
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });

export const RESET_MINUTES = 60;
