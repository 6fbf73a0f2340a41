// Integration tests talk to the built app over HTTP and to the test database directly.
// `npm test` starts the app and sets LW_TEST_BASE_URL; run alone, this starts it (the build and database must exist).
import type { ChildProcess } from 'node:child_process';

let server: ChildProcess | null = null;
let mail: { close: () => Promise<unknown> } | null = null;
let storage: { close: () => Promise<unknown> } | null = null;

export async function setup() {
	if (process.env.LW_TEST_BASE_URL) return;
	const { startTestServer, startTestMailServer, startTestObjectStore } = await import('../../scripts/test-server.mjs');
	const { waitForHttp, storageEnv } = await import('../../scripts/setup.mjs');
	const { testS3Port } = await import('../../scripts/object-store.mjs');
	// Beside `npm test`'s own port, so a run alone does not take another checkout's default.
	const port = Number(process.env.LW_TEST_PORT ?? 3100) + 50;
	mail = await startTestMailServer();
	const store = await startTestObjectStore();
	storage = store;
	// the tests read the bucket with the app's settings
	Object.assign(process.env, storageEnv(testS3Port), store ? { LW_S3_DIR: store.dir } : {});
	server = startTestServer(port);
	process.env.LW_TEST_BASE_URL = `http://127.0.0.1:${port}`;
	await waitForHttp(`${process.env.LW_TEST_BASE_URL}/signin`);
}

export async function teardown() {
	await mail?.close();
	await storage?.close();
	if (!server) return;
	const exited = new Promise((resolve) => server!.once('exit', resolve));
	server.kill('SIGKILL');
	await exited;
}
