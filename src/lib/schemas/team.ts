// Members and invitations of a team.
import { z } from 'zod';
import { email } from './auth';

export const ROLE_VALUES = ['owner', 'engineer', 'viewer'] as const;
export const role = z.enum(ROLE_VALUES, { message: "role must be 'owner', 'engineer' or 'viewer'" });

export const inviteInput = z.object({ email, role });
export const roleChangeInput = z.object({ userId: z.string().uuid('userId: not a member'), role });
export const memberInput = z.object({ userId: z.string().uuid('userId: not a member') });
export const invitationRef = z.object({ invitationId: z.string().uuid('invitationId: not an invitation') });

/** Accepting an invitation by creating a new account. */
export const acceptWithNewAccount = z.object({
	name: z.string().trim().min(1, 'Name is required').max(120, 'Name is at most 120 characters'),
	password: z.string().min(10, 'Password must be at least 10 characters').max(200, 'Password is too long')
});

export const INVITATION_DAYS = 7;
