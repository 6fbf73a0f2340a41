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
	ORIGIN: z.string().url({ message: 'ORIGIN must be the public URL, e.g. https://linkwright.example.test' }).optional(),
	// Outgoing mail (nodemailer over SMTP). `npm start`, `npm run dev` and `npm test` point these at the fake server.
	SMTP_HOST: z.string().min(1).default('127.0.0.1'),
	SMTP_PORT: z.coerce.number({ message: 'SMTP_PORT must be a port number' }).int().min(1).max(65535).default(2525),
	SMTP_SECURE: flag,
	SMTP_USER: z.string().optional(),
	SMTP_PASS: z.string().optional(),
	MAIL_FROM: z.string().min(3).default('Linkwright <no-reply@linkwright.test>'),
	// The fake SMTP server's folder, read by the mailbox page in development and demo mode.
	LW_MAILBOX_DIR: z.string().optional(),
	// Object storage for scans (any S3-compatible service). `npm start`, `npm run dev` and `npm test` point these at
	// the local fake (scripts/object-store.mjs) unless S3_ENDPOINT is set.
	S3_ENDPOINT: z.string().url({ message: 'S3_ENDPOINT must be a URL, e.g. https://s3.eu-central-1.example.test' }).optional(),
	S3_PUBLIC_ENDPOINT: z.string().url({ message: 'S3_PUBLIC_ENDPOINT must be a URL' }).optional(),
	S3_BUCKET: z.string().min(3, { message: 'S3_BUCKET must name a bucket' }).default('linkwright-scans'),
	S3_REGION: z.string().min(1).default('us-east-1'),
	S3_ACCESS_KEY_ID: z.string().optional(),
	S3_SECRET_ACCESS_KEY: z.string().optional(),
	S3_FORCE_PATH_STYLE: flag
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
