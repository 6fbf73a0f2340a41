// Telling a database outage from a bug: connection failures, server shutdown and our own timeouts answer 503
// with Retry-After (RFC 9110 §15.6.4 and §10.2.3), every other failure stays a 500.

/** Seconds a client is asked to wait before trying again while the database is unreachable. */
export const RETRY_AFTER_S = 5;
export const UNAVAILABLE_MESSAGE = 'The database is unavailable at the moment. Try again in a few seconds.';

/** Socket and driver codes of a database that cannot be reached (Node's errno names and the postgres driver's own). */
const NETWORK_CODES = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'ETIMEDOUT',
	'EPIPE',
	'EHOSTUNREACH',
	'ENOTFOUND',
	'CONNECT_TIMEOUT',
	'CONNECTION_CLOSED',
	'CONNECTION_ENDED',
	'CONNECTION_DESTROYED'
]);

/**
 * PostgreSQL SQLSTATEs of an unavailable server (PostgreSQL 15 manual, Appendix A): class 08 connection exceptions,
 * 57P01 admin_shutdown, 57P02 crash_shutdown, 57P03 cannot_connect_now, 57014 query_canceled (our statement_timeout).
 */
function unavailableState(code: string) {
	return code.startsWith('08') || code === '57P01' || code === '57P02' || code === '57P03' || code === '57014';
}

/** True when an error (or one of its causes, as Drizzle wraps the driver's) says the database is unreachable. */
export function isDatabaseUnavailable(e: unknown): boolean {
	for (let cur = e, depth = 0; cur && typeof cur === 'object' && depth < 6; cur = (cur as { cause?: unknown }).cause, depth++) {
		const code = (cur as { code?: unknown }).code;
		if (typeof code === 'string' && (NETWORK_CODES.has(code) || (/^[0-9A-Z]{5}$/.test(code) && unavailableState(code)))) return true;
		if (cur instanceof AggregateError && cur.errors.some(isDatabaseUnavailable)) return true;
	}
	return false;
}

/** The innermost cause's message (the driver's or the socket's, without the failed query's text). */
function rootMessage(e: unknown): string {
	let cur = e;
	for (let depth = 0; depth < 6 && cur && typeof cur === 'object' && (cur as { cause?: unknown }).cause; depth++) cur = (cur as { cause: unknown }).cause;
	const err = cur as { code?: string; message?: string };
	return [err?.code, err?.message].filter(Boolean).join(' ') || String(e);
}

let lastLog = 0;
let quiet = 0;
/** Logs an outage at most once per RETRY_AFTER_S seconds, with how many failures were not logged. */
export function logUnavailable(e: unknown) {
	const now = Date.now();
	if (now - lastLog < RETRY_AFTER_S * 1000) {
		quiet++;
		return;
	}
	console.error(`database unavailable: ${rootMessage(e)}${quiet ? ` (and ${quiet} more failures since the last message)` : ''}`);
	lastLog = now;
	quiet = 0;
}
