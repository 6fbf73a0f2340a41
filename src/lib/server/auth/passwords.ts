// Password hashing with Argon2id (the @node-rs/argon2 package).
import { hash, verify } from '@node-rs/argon2';

const OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1 } as const;

/** Hashes a password for storage. */
export function hashPassword(password: string): Promise<string> {
	return hash(password, OPTIONS);
}

// A real hash of a random password, checked when the account does not exist, so both paths take the same time.
const DUMMY_HASH = '$argon2id$v=19$m=19456,t=2,p=1$UfQ2XoHTT4jV4wnM+01lxw$oFAWWx9XtOFLtlmBtgYw0zrtHiSBQhh+V7emdNWjH14';

/** Checks a password against a stored hash; with no hash it still spends the same work and returns false. */
export async function checkPassword(storedHash: string | null, password: string): Promise<boolean> {
	try {
		const ok = await verify(storedHash ?? DUMMY_HASH, password);
		return storedHash !== null && ok;
	} catch {
		return false;
	}
}
