#!/usr/bin/env node
// The app's server (what `npm start` and the tests run instead of `node build`): adapter-node's documented custom
// server, its build/handler.js on a plain Node http server, with the share sheet's fast path in front. A GET under
// /s/ goes first to the function the server bundle registers (src/lib/server/sharing/sheet-cache.ts,
// `shareFastPath`): a 304 or a rendered sheet kept in memory is written straight to the socket, with the same status,
// headers and bytes as the SvelteKit path; anything else (null) goes to SvelteKit as before.
//
// Kept from build/index.js: HOST/PORT, KEEP_ALIVE_TIMEOUT, HEADERS_TIMEOUT, the 'Listening on' line, and the graceful
// shutdown on SIGTERM/SIGINT (stop accepting, close idle keep-alive connections, let requests in flight finish for
// SHUTDOWN_TIMEOUT s, then emit `sveltekit:shutdown`, on which src/lib/server/lifecycle.ts flushes the batched
// counters and closes the pool). ORIGIN, PROTOCOL_HEADER, HOST_HEADER, PORT_HEADER, ADDRESS_HEADER, XFF_DEPTH and
// BODY_SIZE_LIMIT are read by build/handler.js itself. Not supported here (we use none): SOCKET_PATH, systemd socket
// activation (LISTEN_FDS) and IDLE_TIMEOUT; `node build` still offers them, without the fast path.
// LW_SHARE_FAST_PATH=off sends every request through SvelteKit (to compare the two paths). At shutdown the number of
// requests the fast path answered is printed.
import http from 'node:http';
import process from 'node:process';
import { format } from 'node:url';
import { env, timeout_env } from '../build/env.js';
import { handler } from '../build/handler.js'; // starts SvelteKit's server: hooks.server.ts registers the fast path

for (const name of ['SOCKET_PATH', 'LISTEN_FDS', 'IDLE_TIMEOUT']) {
	if (env(name)) throw new Error(`${name} is not supported by scripts/serve.mjs; run \`node build\` for it`);
}
const host = env('HOST', '0.0.0.0');
const port = env('PORT', '3000');
const shutdownTimeout = parseInt(env('SHUTDOWN_TIMEOUT', '30'));

const fastPath = process.env.LW_SHARE_FAST_PATH === 'off' ? undefined : globalThis[Symbol.for('linkwright.share-fast-path')];
// Without ORIGIN, build/handler.js builds the URL from the request's headers and answers 400 when it cannot; such
// requests are left to it (the fast path needs no URL).
const urlFromHeaders = !env('ORIGIN');
const forwarded = !!(env('PROTOCOL_HEADER') || env('HOST_HEADER') || env('PORT_HEADER'));
const urlKnown = (headers) => !urlFromHeaders || (!forwarded && !!headers.host);

// The client's address exactly as build/handler.js's getClientAddress reads it; undefined when it would fail there.
const addressHeader = env('ADDRESS_HEADER', '').toLowerCase();
const xffDepth = parseInt(env('XFF_DEPTH', '1'));
function clientAddress(req) {
	if (!addressHeader) return req.socket.remoteAddress;
	const value = req.headers[addressHeader];
	if (typeof value !== 'string' || addressHeader !== 'x-forwarded-for') return value;
	const addresses = value.split(',');
	return xffDepth >= 1 && xffDepth <= addresses.length ? addresses[addresses.length - xffDepth].trim() : undefined;
}

/** An error escaping a handler, answered as polka (build/index.js) would. */
function fail(res, err) {
	if (res.headersSent) return void res.destroy();
	res.statusCode = typeof err?.status === 'number' && err.status >= 100 ? err.status : 500;
	res.end(err?.message || http.STATUS_CODES[res.statusCode]);
}

/** SvelteKit's path: static files, then the app. */
function slow(req, res) {
	try {
		Promise.resolve(handler(req, res, (err) => fail(res, err ?? { status: 404 }))).catch((err) => fail(res, err));
	} catch (err) {
		fail(res, err);
	}
}

/** Requests the fast path answered (printed at shutdown). */
let fastAnswers = 0;

/** The fast path's answer written out, or SvelteKit's path when it has none (or fails: e.g. the database is down). */
async function fastOrSlow(req, res, pathname, address) {
	let answer = null;
	try {
		answer = await fastPath(req.method, pathname, req.headers, address);
	} catch {
		// left to SvelteKit, which answers it (503 when the database is unreachable)
	}
	if (!answer) return slow(req, res);
	res.writeHead(answer.status, answer.headers);
	res.end(answer.body ?? undefined);
	fastAnswers++;
}

function onRequest(req, res) {
	const { method, url, headers } = req;
	if (fastPath && (method === 'GET' || method === 'HEAD') && url.startsWith('/s/') && urlKnown(headers)) {
		const address = clientAddress(req);
		// a GET with a body is left to SvelteKit (it ignores it, but reads nothing over BODY_SIZE_LIMIT)
		if (address && !headers['transfer-encoding'] && !(Number(headers['content-length']) > 0)) {
			const q = url.indexOf('?');
			fastOrSlow(req, res, q < 0 ? url : url.slice(0, q), address).catch((err) => fail(res, err));
			return;
		}
	}
	slow(req, res);
}

const server = http.createServer(onRequest);
const keepAliveTimeout = timeout_env('KEEP_ALIVE_TIMEOUT');
if (keepAliveTimeout !== undefined) server.keepAliveTimeout = keepAliveTimeout * 1000;
const headersTimeout = timeout_env('HEADERS_TIMEOUT');
if (headersTimeout !== undefined) server.headersTimeout = headersTimeout * 1000;

server.listen({ host, port }, () => {
	const address = server.address();
	console.log(`Listening on ${format({ protocol: 'http:', hostname: address?.address ?? host, port: address?.port ?? port })}`);
});

let shutdownTimer;
/** build/index.js's graceful shutdown: no new connections, idle ones closed, the rest after SHUTDOWN_TIMEOUT s. */
function gracefulShutdown(reason) {
	if (shutdownTimer) return;
	// a keep-alive connection would hold close() until it times out
	server.closeIdleConnections();
	server.close((error) => {
		if (error) return; // already closed
		clearTimeout(shutdownTimer);
		if (fastPath) console.log(`[serve] the share fast path answered ${fastAnswers} requests`);
		process.emit('sveltekit:shutdown', reason);
	});
	shutdownTimer = setTimeout(() => server.closeAllConnections(), shutdownTimeout * 1000);
}
server.on('request', (req) => {
	// while shutting down, a connection is closed as soon as its request is answered
	req.on('close', () => shutdownTimer && server.closeIdleConnections());
});
process.on('SIGTERM', gracefulShutdown);
process.on('SIGINT', gracefulShutdown);
