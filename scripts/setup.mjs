// Set-up shared by `npm start`, `npm test` and `npm run dev`: packages, database, secret, build.
// Only Node's built-ins at the top level, since node_modules may not exist yet.
import { execFileSync, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { root, start as startDatabase, databaseUrl, resetDatabase, appDatabase, testDatabase } from './db.mjs';
import { mailboxDir } from './mail-server.mjs';

const isRoot = process.getuid?.() === 0;

/** Prints a step. */
export function say(message) {
	console.log(`[setup] ${message}`);
}

/** Runs a command in the project folder, failing loudly. */
export function run(command, args, env = {}) {
	execFileSync(command, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
}

/** Installs npm packages when node_modules is missing or older than the lock file. */
export function ensurePackages() {
	const marker = path.join(root, 'node_modules', '.package-lock.json');
	const lock = path.join(root, 'package-lock.json');
	const stale = !fs.existsSync(marker) || (fs.existsSync(lock) && fs.statSync(lock).mtimeMs > fs.statSync(marker).mtimeMs + 1000);
	if (!stale) return;
	say('installing npm packages');
	run('npm', [fs.existsSync(lock) ? 'ci' : 'install', '--no-audit', '--no-fund']);
	// npm 11 may hold back install scripts (the project's postinstall too): apply patches/ ourselves; it is idempotent.
	run('npx', ['patch-package']);
}

/** Installs Debian's Chromium for the browser tests when it is missing. */
export function ensureChromium() {
	if (fs.existsSync('/usr/bin/chromium')) return;
	if (!isRoot) {
		console.error('[setup] Chromium is missing. Install it with: sudo apt-get update && sudo apt-get install -y chromium');
		process.exit(1);
	}
	say('installing Chromium from Debian packages');
	const env = { DEBIAN_FRONTEND: 'noninteractive' };
	run('apt-get', ['update'], env);
	run('apt-get', ['install', '-y', '--no-install-recommends', 'chromium', 'fonts-dejavu-core'], env);
}

/** The session-signing secret: AUTH_SECRET from the environment, or one generated once for this checkout. */
export function authSecret() {
	if (process.env.AUTH_SECRET) return process.env.AUTH_SECRET;
	const file = path.join(root, '.data', 'auth-secret');
	if (!fs.existsSync(file)) {
		fs.mkdirSync(path.dirname(file), { recursive: true });
		fs.writeFileSync(file, randomBytes(32).toString('base64url'), { mode: 0o600 });
	}
	return fs.readFileSync(file, 'utf8').trim();
}

/** Starts PostgreSQL, then migrates and seeds one database (reset first when asked). */
export function prepareDatabase({ test = false } = {}) {
	try {
		startDatabase();
	} catch (e) {
		console.error(`[db] ${e instanceof Error ? e.message : e}`);
		process.exit(1);
	}
	const name = test ? testDatabase : appDatabase;
	if (test) {
		say(`resetting ${name}`);
		resetDatabase(name);
	}
	const url = databaseUrl(name);
	run('node', ['scripts/migrate.mjs', url]);
	run('npx', ['tsx', 'scripts/seed.ts', url]);
	return url;
}

/** Newest modification time under a path (a file or a folder). */
function newest(target) {
	if (!fs.existsSync(target)) return 0;
	const stat = fs.statSync(target);
	if (!stat.isDirectory()) return stat.mtimeMs;
	let max = stat.mtimeMs;
	for (const entry of fs.readdirSync(target)) max = Math.max(max, newest(path.join(target, entry)));
	return max;
}

/** Builds the app with Vite unless the build is newer than every source. */
export function ensureBuild() {
	const stamp = path.join(root, 'build', '.stamp');
	const sources = ['src', 'static', 'svelte.config.js', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json', 'scripts/worker-bundle.mjs'];
	const built = fs.existsSync(stamp) ? fs.statSync(stamp).mtimeMs : 0;
	if (built && sources.every((s) => newest(path.join(root, s)) < built)) return;
	say('building the app');
	run('npx', ['vite', 'build', '--logLevel', 'error']);
	fs.writeFileSync(stamp, new Date().toISOString());
}

/**
 * The object storage settings: S3_ENDPOINT and the others from the environment when it is set (a real S3-compatible
 * service), else the local fake on 127.0.0.1:s3Port with its one key pair and path-style addressing.
 */
export function storageEnv(s3Port) {
	if (process.env.S3_ENDPOINT) return {};
	return {
		S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
		S3_BUCKET: process.env.S3_BUCKET ?? 'linkwright-scans',
		S3_REGION: process.env.S3_REGION ?? 'us-east-1',
		S3_ACCESS_KEY_ID: 'S3RVER',
		S3_SECRET_ACCESS_KEY: 'S3RVER',
		S3_FORCE_PATH_STYLE: 'true'
	};
}

/** The environment the app server runs with; mail goes to SMTP_HOST:SMTP_PORT, else to the fake server on smtpPort. */
export function appEnv({ databaseUrl: url, port, smtpPort, s3Port = 0 }) {
	return {
		...(s3Port ? storageEnv(s3Port) : {}),
		// the AWS SDK warns on every start that its releases from 2027 need Node 22; the project is on Node 20 with a locked SDK
		AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ?? 'true',
		SMTP_HOST: process.env.SMTP_HOST ?? '127.0.0.1',
		SMTP_PORT: process.env.SMTP_HOST ? (process.env.SMTP_PORT ?? '587') : String(smtpPort),
		LW_MAILBOX_DIR: mailboxDir(smtpPort),
		DATABASE_URL: url,
		AUTH_SECRET: authSecret(),
		AUTH_TRUST_HOST: 'true',
		LW_DEMO: process.env.LW_DEMO ?? 'true',
		HOST: '127.0.0.1',
		PORT: String(port),
		// Uploads up to 5 MB are imported; larger ones must reach the app to get its clear message.
		BODY_SIZE_LIMIT: process.env.BODY_SIZE_LIMIT ?? '25M',
		ORIGIN: process.env.ORIGIN ?? `http://127.0.0.1:${port}`,
		// adapter-node: on SIGTERM, requests in flight get this many seconds before their connections close, so the
		// app exits within 5 s (the pool closes after the last request)
		SHUTDOWN_TIMEOUT: process.env.SHUTDOWN_TIMEOUT ?? '3'
	};
}

/** Waits until an HTTP server answers at url. */
export async function waitForHttp(url, timeoutMs = 60000) {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		try {
			const res = await fetch(url, { redirect: 'manual' });
			if (res.status < 500) return;
		} catch {
			// not up yet
		}
		await new Promise((r) => setTimeout(r, 250));
	}
	throw new Error(`no answer from ${url} after ${timeoutMs / 1000} s`);
}

export { spawnSync };
