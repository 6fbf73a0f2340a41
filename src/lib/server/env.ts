// The server's configuration, parsed once at start-up so a bad setting fails early.
import { env } from '$env/dynamic/private';
import { z } from 'zod';

const flag = z
	.enum(['true', 'false', '1', '0', ''])
	.optional()
	.transform((v) => v === 'true' || v === '1');

const schema = z.object({
	DATABASE_URL: z.string().url({ message: 'DATABASE_URL must be a postgres:// URL' }),
	AUTH_SECRET: z.string().min(32, { message: 'AUTH_SECRET must be at least 32 characters' }),
	AUTH_TRUST_HOST: flag,
	LW_DEMO: flag,
	SMTP_URL: z.string().optional(),
	MAIL_FROM: z.string().default('Linkwright <no-reply@linkwright.test>')
});

export type ServerEnv = z.infer<typeof schema>;
let parsed: ServerEnv | null = null;

/** The parsed environment; throws naming the variable when one is wrong. */
export function serverEnv(): ServerEnv {
	if (parsed) return parsed;
	const result = schema.safeParse(env);
	if (!result.success) {
		const issue = result.error.issues[0];
		throw new Error(`Bad configuration: ${issue.path.join('.')}: ${issue.message}`);
	}
	parsed = result.data;
	return parsed;
}
