// Random tokens (share links, invitations, API tokens) and their stored hashes.
import { createHash, randomBytes } from 'node:crypto';

/** A new token of 32 random bytes (256 bits), URL-safe, with an optional prefix. */
export function newToken(prefix = ''): string {
	return prefix + randomBytes(32).toString('base64url');
}

/** The SHA-256 hash under which a token is stored. */
export function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}
