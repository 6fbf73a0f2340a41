// Sign-in and sign-up inputs.
import { z } from 'zod';

export const email = z
	.string({ message: 'E-mail is required' })
	.trim()
	.toLowerCase()
	.email('Enter a valid e-mail address')
	.max(254, 'E-mail is too long');

export const signInInput = z.object({
	email,
	password: z.string({ message: 'Password is required' }).min(1, 'Password is required').max(200, 'Password is too long')
});

export const signUpInput = z.object({
	name: z.string().trim().min(1, 'Name is required').max(120, 'Name is at most 120 characters'),
	email,
	password: z.string().min(10, 'Password must be at least 10 characters').max(200, 'Password is too long'),
	teamName: z.string().trim().min(1, 'Team name is required').max(120, 'Team name is at most 120 characters')
});

export type SignInInput = z.infer<typeof signInInput>;
export type SignUpInput = z.infer<typeof signUpInput>;
