// Bad input never loses data and never breaks the server: each case below is answered 4xx (never 5xx) with a
// message naming the field, and no row is written (the rows an account can reach are counted before and after).
// Sources: OWASP Input Validation Cheat Sheet (allow-list validation, reject rather than sanitise), OWASP Testing
// Guide WSTG-INPV-05 (SQL injection probes) and WSTG-CLNT-01/INPV-01 (HTML in input), RFC 9110 §15.5.14 (413) and
// §15.5.16 (415). Spreadsheet formula cells (OWASP CSV Injection) are not here: the CSV neutraliser is built on
// another branch (issue 21, item 2) and its cases belong with it.
import { readFileSync } from 'node:fs';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { hashToken, newToken } from '../../src/lib/server/auth/tokens';
import { createApiToken } from '../../src/lib/server/db/queries/users';
import { baseUrl, closeDb, freshAccount, testDb, type Client } from './helpers';

const stock = JSON.parse(readFileSync('fixtures/club-fwd-front-left.json', 'utf8'));
const HTML = '<script>alert(1)</script>';
const SQLI = "x'); DROP TABLE cars; --";
const long = (n: number) => 'a'.repeat(n);
const uuid = '00000000-0000-4000-8000-00000000beef';
const MM = JSON.stringify({ unit: 'mm' });

/** A JSON request: a body sent as application/json unless contentType says otherwise; raw bodies as given. */
interface Case {
	name: string;
	method: string;
	path: string;
	json?: unknown;
	raw?: string | FormData | Uint8Array;
	contentType?: string;
	form?: Record<string, string>; // a page's form action (application/x-www-form-urlencoded, cookie session)
	status: number;
	/** the field the answer must name (API: error.field or its message; page: the form's message text) */
	field: string;
}

/** A geometry with one change. */
function geometryWith(change: (g: typeof stock) => void) {
	const g = structuredClone(stock);
	change(g);
	return g;
}

let ctx: { token: string; client: Client; carId: string; cornerId: string; revisionId: string; studyId: string; teamId: string; userId: string };

function cases(): Case[] {
	const { carId, cornerId, revisionId, studyId } = ctx;
	const cars = '/api/v1/cars';
	const car = `/api/v1/cars/${carId}`;
	const corners = `${car}/corners`;
	const revisions = `/api/v1/corners/${cornerId}/revisions`;
	const studies = `/api/v1/corners/${cornerId}/studies`;
	const tolerances = `/api/v1/corners/${cornerId}/studies/${studyId}/tolerances`;
	const rev = `/api/v1/revisions/${revisionId}`;
	const imp = `/api/v1/corners/${cornerId}/import`;
	const post = (path: string, json: unknown, field: string, name: string, status = 400): Case => ({ name, method: 'POST', path, json, field, status });
	const multipart = (fields: Record<string, string | File>) => {
		const f = new FormData();
		for (const [k, v] of Object.entries(fields)) f.set(k, v);
		return f;
	};
	const csv = (text: string) => new File([text], 'points.csv', { type: 'text/csv' });
	const goodCsv = readFileSync('fixtures/club-fwd-front-left-scan-inches.csv', 'utf8');
	const band = { kind: 'band', min: -0.1, max: 0.1 };
	const fix = { travel: { from: -40, to: 40, step: 5 }, free: [{ point: 'steer.inner', axis: 'z', bound: 10 }], target: { kind: 'zero' }, measures: [{ key: 'toe', weight: 1 }] };
	return [
		// cars: names, numbers, enums, HTML and SQL where they do not belong
		post(cars, {}, 'name', 'car without a name'),
		post(cars, { name: '' }, 'name', 'car with an empty name'),
		post(cars, { name: '   ' }, 'name', 'car with a blank name'),
		post(cars, { name: long(121) }, 'name', 'car name of 121 characters'),
		post(cars, { name: 42 }, 'name', 'car name as a number'),
		post(cars, { name: ['a'] }, 'name', 'car name as an array'),
		post(cars, { name: 'Car', series: long(121) }, 'series', 'series of 121 characters'),
		post(cars, { name: 'Car', wheelbaseMm: -1 }, 'wheelbaseMm', 'negative wheelbase'),
		post(cars, { name: 'Car', wheelbaseMm: 0 }, 'wheelbaseMm', 'zero wheelbase'),
		post(cars, { name: 'Car', wheelbaseMm: 1e9 }, 'wheelbaseMm', 'wheelbase of 1e9 mm'),
		post(cars, { name: 'Car', wheelbaseMm: 'abc' }, 'wheelbaseMm', 'wheelbase as letters'),
		post(cars, { name: 'Car', wheelbaseMm: '1; DROP TABLE cars' }, 'wheelbaseMm', 'SQL in a number field'),
		post(cars, { name: 'Car', cgHeightMm: 5000 }, 'cgHeightMm', 'CG height of 5 m'),
		post(cars, { name: 'Car', frontBrakeFraction: 1.5 }, 'frontBrakeFraction', 'brake fraction over 1'),
		post(cars, { name: 'Car', frontBrakeFraction: -0.1 }, 'frontBrakeFraction', 'negative brake fraction'),
		post(cars, { name: 'Car', driveLayout: HTML }, 'driveLayout', 'HTML as the drive layout'),
		post(cars, { name: 'Car', driveLayout: "fwd' OR '1'='1" }, 'driveLayout', 'SQL as the drive layout'),
		post(cars, { name: 'Car', notes: long(5001) }, 'notes', 'notes of 5001 characters'),
		post(cars, { name: HTML, teamId: SQLI }, 'teamId', 'SQL as the team id, HTML as the name'),
		post(cars, { name: SQLI, wheelbaseMm: -5 }, 'wheelbaseMm', 'SQL as the name with a bad wheelbase'),
		{ name: 'PATCH with an empty name', method: 'PATCH', path: car, json: { name: '' }, field: 'name', status: 400 },
		{ name: 'PATCH with a brake fraction of 2', method: 'PATCH', path: car, json: { frontBrakeFraction: 2 }, field: 'frontBrakeFraction', status: 400 },
		{ name: 'PATCH with HTML as drive layout', method: 'PATCH', path: car, json: { driveLayout: HTML }, field: 'driveLayout', status: 400 },
		// corners
		post(corners, {}, 'position', 'corner without a position'),
		post(corners, { position: 'middle', kind: 'double_wishbone' }, 'position', 'corner position "middle"'),
		post(corners, { position: 'front_left', kind: HTML }, 'kind', 'HTML as the suspension kind'),
		post(corners, { position: SQLI, kind: 'strut' }, 'position', 'SQL as the position'),
		// revisions: the corner file
		post(revisions, { label: '', note: '' }, 'geometry', 'revision without geometry'),
		post(revisions, { label: '', note: '', geometry: 'not an object' }, 'geometry', 'geometry as a string'),
		post(revisions, { label: '', note: '', geometry: geometryWith((g) => (g.format = 'corner-geometry/9')) }, 'format', 'unknown file format'),
		post(revisions, { label: '', note: '', geometry: geometryWith((g) => delete g.points['lower.front']) }, 'lower.front', 'a required point missing'),
		post(revisions, { label: '', note: '', geometry: geometryWith((g) => (g.points['lower.front'] = ['1', 2, 3])) }, 'lower.front', 'a coordinate as text'),
		post(revisions, { label: '', note: '', geometry: geometryWith((g) => (g.points['lower.front'] = [1, 2])) }, 'lower.front', 'a point with two coordinates'),
		post(revisions, { label: '', note: '', geometry: geometryWith((g) => (g.points['lower.front'] = [1e12, 0, 0])) }, 'lower.front', 'a point a million km away'),
		post(revisions, { label: '', note: '', geometry: geometryWith((g) => (g.tyre.loaded_radius = -300)) }, 'loaded_radius', 'negative loaded radius'),
		post(revisions, { label: '', note: '', geometry: geometryWith((g) => (g.kind = 'strut')) }, 'strut', 'kind strut with wishbone points'),
		post(revisions, { label: '', note: '', geometry: geometryWith((g) => (g.kind = HTML)) }, 'kind', 'HTML as the geometry kind'),
		post(revisions, { label: long(121), note: '', geometry: stock }, 'label', 'label of 121 characters'),
		post(revisions, { label: '', note: long(5001), geometry: stock }, 'note', 'note of 5001 characters'),
		post('/api/v1/solve', { geometry: geometryWith((g) => (g.points['upper.front'] = null)) }, 'upper.front', 'solve with a null point'),
		post('/api/v1/solve', { geometry: stock, sweep: { sweep: 'jump' } }, 'sweep', 'solve with sweep "jump"'),
		// baseline
		{ name: 'baseline with a malformed id', method: 'PUT', path: `/api/v1/corners/${cornerId}/baseline`, json: { revisionId: 'not-a-uuid' }, field: 'revisionId', status: 400 },
		{ name: 'baseline with SQL as id', method: 'PUT', path: `/api/v1/corners/${cornerId}/baseline`, json: { revisionId: SQLI }, field: 'revisionId', status: 400 },
		// studies and adopted tolerances
		post(studies, { name: '', settings: { sweep: 'heave', from: -50, to: 50, step: 5 } }, 'name', 'study without a name'),
		post(studies, { name: 'S', settings: { sweep: 'jump', from: -50, to: 50, step: 5 } }, 'sweep', 'study sweep "jump"'),
		post(studies, { name: 'S', settings: { sweep: 'heave', from: -50, to: 50, step: 0 } }, 'step', 'study step 0'),
		post(studies, { name: 'S', settings: { sweep: 'heave', from: 'a', to: 50, step: 5 } }, 'from', 'study from as text'),
		post(studies, { name: 'S', settings: { sweep: 'heave', from: -50, to: 50, step: 5, overlays: [SQLI] } }, 'overlays', 'SQL as an overlay id'),
		post(studies, { name: 'S', settings: { sweep: 'heave', from: -50, to: 50, step: 5, overlays: Array(11).fill(uuid) } }, 'overlays', 'eleven overlays'),
		{ name: 'tolerances with a malformed revision id', method: 'PUT', path: tolerances, json: { revisionId: 'x', points: {} }, field: 'revisionId', status: 400 },
		{ name: 'tolerance of 50 mm', method: 'PUT', path: tolerances, json: { revisionId, points: { 'steer.inner': { mm: 50, mode: 'axis' } } }, field: 'mm', status: 400 },
		{ name: 'tolerance mode "cube"', method: 'PUT', path: tolerances, json: { revisionId, points: { 'steer.inner': { mm: 0.5, mode: 'cube' } } }, field: 'mode', status: 400 },
		// sweep parameters in query strings
		{ name: 'solve sweep "jump"', method: 'GET', path: `${rev}/solve?sweep=jump`, field: 'sweep', status: 400 },
		{ name: 'solve from as letters', method: 'GET', path: `${rev}/solve?from=abc`, field: 'from', status: 400 },
		{ name: 'solve step 0', method: 'GET', path: `${rev}/solve?step=0`, field: 'step', status: 400 },
		{ name: 'solve step negative', method: 'GET', path: `${rev}/solve?step=-5`, field: 'step', status: 400 },
		{ name: 'solve with SQL as the sweep', method: 'GET', path: `${rev}/solve?sweep=${encodeURIComponent("heave'; DROP TABLE revisions; --")}`, field: 'sweep', status: 400 },
		{ name: 'export format xml', method: 'GET', path: `${rev}/export?format=xml`, field: 'format', status: 400 },
		// analyses
		post(`${rev}/fix-search`, { ...fix, free: [] }, 'free', 'fix search with nothing free'),
		post(`${rev}/fix-search`, { ...fix, free: [{ point: HTML, axis: 'z', bound: 10 }] }, 'point', 'fix search on an HTML point'),
		post(`${rev}/fix-search`, { ...fix, free: [{ point: 'steer.inner', axis: 'w', bound: 10 }] }, 'axis', 'fix search on axis w'),
		post(`${rev}/fix-search`, { ...fix, free: [{ point: 'steer.inner', axis: 'z', bound: 1000 }] }, 'bound', 'fix search bound of 1 m'),
		post(`${rev}/fix-search`, { ...fix, travel: { from: 10, to: 40, step: 5 } }, 'from', 'fix search range without design'),
		post(`${rev}/fix-search`, { ...fix, travel: { from: -40, to: 40, step: 0.001 } }, 'step', 'fix search with 80001 positions'),
		post(`${rev}/fix-search`, { ...fix, target: { kind: 'revision', revisionId: SQLI } }, 'revisionId', 'fix search target with SQL as id'),
		post(`${rev}/fix-search`, { ...fix, target: { ...band, min: 0.1 } }, 'min', 'fix search band without zero'),
		post(`${rev}/fix-search`, { ...fix, starts: 1000 }, 'starts', 'fix search with 1000 starts'),
		post(`${rev}/moves`, { moves: [{ point: 'steer.inner', axis: 'z', move: 500 }] }, 'move', 'a move of 500 mm'),
		post(`${rev}/moves`, { moves: [{ point: 'steer.inner', axis: 'z', move: 1 }], label: long(121) }, 'label', 'moves label of 121 characters'),
		post(`${rev}/tolerance-study`, { samples: 10 }, 'samples', 'tolerance study of 10 samples'),
		post(`${rev}/tolerance-study`, { samples: 1e6 }, 'samples', 'tolerance study of a million samples'),
		post(`${rev}/tolerance-study`, { distribution: 'cauchy' }, 'distribution', 'tolerance study distribution "cauchy"'),
		post(`${rev}/tolerance-study`, { threads: 64 }, 'threads', 'tolerance study on 64 threads'),
		post(`${rev}/tolerance-study`, { seed: -1 }, 'seed', 'tolerance study seed -1'),
		// share links
		post(`${rev}/shares`, { expiresInDays: 0 }, 'expiresInDays', 'share valid 0 days'),
		post(`${rev}/shares`, { expiresInDays: 366 }, 'expiresInDays', 'share valid 366 days'),
		post(`${rev}/shares`, { expiresInDays: 'forever' }, 'expiresInDays', 'share valid "forever"'),
		post(`${rev}/shares`, { note: long(1001) }, 'note', 'share note of 1001 characters'),
		post(`${rev}/shares`, { email: 'not-an-address' }, 'email', 'share mailed to "not-an-address"'),
		post(`${rev}/shares`, { email: `${HTML}@example.test` }, 'email', 'share mailed to an HTML address'),
		// CSV files and multipart bodies
		{ name: 'import without a file', method: 'POST', path: imp, raw: multipart({ options: '{}' }), field: 'file', status: 400 },
		{ name: 'import with options that are not JSON', method: 'POST', path: imp, raw: multipart({ file: csv(goodCsv), options: '{unit: in' }), field: 'options', status: 400 },
		{ name: 'import in furlongs', method: 'POST', path: imp, raw: multipart({ file: csv(goodCsv), options: JSON.stringify({ unit: 'furlong' }) }), field: 'unit', status: 400 },
		{ name: 'import with dryRun "maybe"', method: 'POST', path: imp, raw: multipart({ file: csv(goodCsv), dryRun: 'maybe' }), field: 'dryRun', status: 400 },
		{ name: 'import with a negative loaded radius', method: 'POST', path: imp, raw: multipart({ file: csv(goodCsv), loadedRadius: '-5' }), field: 'loadedRadius', status: 400 },
		{ name: 'import with the spring on the "frame"', method: 'POST', path: imp, raw: multipart({ file: csv(goodCsv), springOn: 'frame' }), field: 'springOn', status: 400 },
		{ name: 'import label of 121 characters', method: 'POST', path: imp, raw: multipart({ file: csv(goodCsv), label: long(121) }), field: 'label', status: 400 },
		{ name: 'import of an empty file', method: 'POST', path: imp, raw: multipart({ file: csv('') , options: MM }), field: 'file', status: 400 },
		{ name: 'import of binary bytes', method: 'POST', path: imp, raw: multipart({ file: new File([new Uint8Array([0, 159, 146, 150, 0, 255, 254, 0])], 'x.csv') , options: MM }), field: 'file', status: 400 },
		{ name: 'import with letters for numbers', method: 'POST', path: imp, raw: multipart({ file: csv('lower.front,abc,1,2\nlower.rear,1,2,3\n') , options: MM }), field: 'x', status: 400 },
		{ name: 'import with two columns', method: 'POST', path: imp, raw: multipart({ file: csv('lower.front,1\nlower.rear,2\n') , options: MM }), field: 'column', status: 400 },
		{ name: 'import of HTML instead of CSV', method: 'POST', path: imp, raw: multipart({ file: csv(`<html><body>${HTML}</body></html>`) , options: MM }), field: 'file', status: 400 },
		{ name: 'import of 6 MB', method: 'POST', path: imp, raw: multipart({ file: csv('p,1,2,3\n'.repeat(800_000)) , options: MM }), field: 'file', status: 400 },
		// wrong content types
		{ name: 'car as text/plain', method: 'POST', path: cars, raw: JSON.stringify({ name: 'Car' }), contentType: 'text/plain', field: 'content-type', status: 415 },
		{ name: 'car as application/xml', method: 'POST', path: cars, raw: '<car><name>Car</name></car>', contentType: 'application/xml', field: 'content-type', status: 415 },
		{ name: 'revision as a form', method: 'POST', path: revisions, raw: 'label=x', contentType: 'application/x-www-form-urlencoded', field: 'content-type', status: 415 },
		{ name: 'share as multipart', method: 'POST', path: `${rev}/shares`, raw: multipart({ note: 'x' }), field: 'content-type', status: 415 },
		{ name: 'import as JSON', method: 'POST', path: imp, json: { file: 'lower.front,1,2,3' }, field: 'content-type', status: 415 },
		{ name: 'solve without a content type', method: 'POST', path: '/api/v1/solve', raw: new TextEncoder().encode(JSON.stringify({ geometry: stock })), contentType: '', field: 'content-type', status: 415 },
		{ name: 'malformed JSON', method: 'POST', path: cars, raw: '{"name": "Car"', contentType: 'application/json', field: 'JSON', status: 400 },
		// oversized body (BODY_SIZE_LIMIT is 25 MB under `npm test`)
		{ name: 'a 26 MB revision', method: 'POST', path: revisions, raw: JSON.stringify({ label: '', note: long(26 * 1024 * 1024), geometry: stock }), contentType: 'application/json', field: 'larger', status: 413 },
		// non-UUID ids in paths
		{ name: 'car id "123"', method: 'GET', path: '/api/v1/cars/123', field: '', status: 404 },
		{ name: 'corner id with SQL', method: 'GET', path: `/api/v1/corners/${encodeURIComponent("1' OR '1'='1")}/revisions`, field: '', status: 404 },
		{ name: 'revision id with HTML', method: 'GET', path: `/api/v1/revisions/${encodeURIComponent(HTML)}`, field: '', status: 404 },
		{ name: 'share id "../../etc/passwd"', method: 'DELETE', path: '/api/v1/shares/..%2F..%2Fetc%2Fpasswd', field: '', status: 404 },
		{ name: 'study id not a UUID', method: 'GET', path: `/api/v1/corners/${cornerId}/studies/abc/tolerances`, field: '', status: 404 },
		// page forms (a browser's form post with the session cookie)
		{ name: 'new-car form without a name', method: 'POST', path: '/cars/new', form: { name: '' }, field: 'Name is required', status: 400 },
		{ name: 'new-car form with HTML and a bad wheelbase', method: 'POST', path: '/cars/new', form: { name: HTML, wheelbaseMm: '-3' }, field: 'Wheelbase must be', status: 400 },
		{ name: 'edit-car form with a name of 121 characters', method: 'POST', path: `/cars/${carId}/edit`, form: { name: long(121) }, field: 'Name is at most 120', status: 400 },
		{ name: 'corner form with SQL as position', method: 'POST', path: `/cars/${carId}?/addCorner`, form: { position: SQLI, kind: 'strut' }, field: 'osition', status: 400 },
		{ name: 'share form valid 999 days', method: 'POST', path: `/revisions/${revisionId}?/createShare`, form: { expiresInDays: '999' }, field: '365', status: 400 },
		{ name: 'invitation form with an HTML address', method: 'POST', path: '/team/members?/invite', form: { email: HTML, role: 'viewer' }, field: 'mail', status: 400 },
		{ name: 'invitation form with role "admin"', method: 'POST', path: '/team/members?/invite', form: { email: 'x@example.test', role: 'admin' }, field: 'ole', status: 400 },
		{ name: 'token form without a name', method: 'POST', path: '/account?/createToken', form: { name: '' }, field: 'ame', status: 400 },
		{ name: 'baseline form with SQL as revision', method: 'POST', path: `/corners/${cornerId}?/baseline`, form: { revisionId: SQLI }, field: 'revision', status: 400 }
	];
}

/** Rows the account can reach, and all accounts: counted before and after each case. */
async function rowCounts() {
	const { teamId, userId } = ctx;
	const [row] = await testDb().execute<Record<string, number>>(sql`select
		(select count(*) from cars where team_id = ${teamId})::int as cars,
		(select count(*) from corners c join cars k on k.id = c.car_id where k.team_id = ${teamId})::int as corners,
		(select count(*) from revisions r join corners c on c.id = r.corner_id join cars k on k.id = c.car_id where k.team_id = ${teamId})::int as revisions,
		(select count(*) from uploads where team_id = ${teamId})::int as uploads,
		(select count(*) from studies s join corners c on c.id = s.corner_id join cars k on k.id = c.car_id where k.team_id = ${teamId})::int as studies,
		(select count(*) from share_links where team_id = ${teamId})::int as share_links,
		(select count(*) from invitations where team_id = ${teamId})::int as invitations,
		(select count(*) from api_tokens where user_id = ${userId})::int as api_tokens,
		(select count(*) from audit_events where team_id = ${teamId})::int as audit_events,
		(select count(*) from users)::int as users,
		(select count(*) from teams)::int as teams`);
	return row;
}

beforeAll(async () => {
	const account = await freshAccount('bad-input');
	const token = newToken('lw_');
	await createApiToken(testDb(), account.user.id, 'bad inputs', hashToken(token));
	const c = account.client;
	const car = await (await c.json('/api/v1/cars', 'POST', { name: 'Bad input car' })).json();
	const corner = await (await c.json(`/api/v1/cars/${car.id}/corners`, 'POST', { position: 'front_left', kind: 'double_wishbone' })).json();
	const revision = await (await c.json(`/api/v1/corners/${corner.id}/revisions`, 'POST', { label: 'stock', note: '', geometry: stock })).json();
	const study = await (await c.json(`/api/v1/corners/${corner.id}/studies`, 'POST', { name: 'S', settings: { sweep: 'heave', from: -50, to: 50, step: 5 } })).json();
	ctx = { token, client: c, carId: car.id, cornerId: corner.id, revisionId: revision.id, studyId: study.id, teamId: account.teamId, userId: account.user.id };
});

afterAll(closeDb);

describe('bad inputs: 4xx naming the field, never 5xx, nothing written', () => {
	test('there are at least 80 cases', () => {
		expect(cases().length).toBeGreaterThanOrEqual(80);
	});

	test('every case', { timeout: 180_000 }, async () => {
		const wrong: string[] = [];
		for (const c of cases()) {
			const before = await rowCounts();
			let res: Response;
			if (c.form) {
				res = await ctx.client.fetch(c.path, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded', accept: 'text/html' }, body: new URLSearchParams(c.form) });
			} else {
				const headers: Record<string, string> = { authorization: `Bearer ${ctx.token}` };
				let body: BodyInit | undefined;
				if (c.json !== undefined) {
					headers['content-type'] = 'application/json';
					body = JSON.stringify(c.json);
				} else if (c.raw !== undefined) {
					if (c.contentType !== undefined && c.contentType !== '') headers['content-type'] = c.contentType;
					body = c.raw as BodyInit;
				}
				res = await fetch(baseUrl() + c.path, { method: c.method, headers, body });
			}
			const text = await res.text();
			const after = await rowCounts();
			const problems: string[] = [];
			if (res.status !== c.status) problems.push(`status ${res.status}, expected ${c.status}`);
			if (res.status >= 500) problems.push('server error');
			if (JSON.stringify(after) !== JSON.stringify(before)) problems.push(`rows changed: ${JSON.stringify(before)} → ${JSON.stringify(after)}`);
			if (c.form) {
				if (!text.includes(c.field)) problems.push(`the page does not say "${c.field}"`);
				// What was typed comes back escaped, never as markup (OWASP XSS Prevention, rule 1).
				if (text.includes(HTML)) problems.push('echoes HTML unescaped');
			} else {
				let error: { field?: string; message?: string; code?: string } = {};
				try {
					error = JSON.parse(text).error ?? {};
				} catch {
					problems.push(`not JSON: ${text.slice(0, 80)}`);
				}
				if (!error.message) problems.push('no message');
				const named = `${error.field ?? ''} ${error.message ?? ''}`;
				if (c.field && !named.includes(c.field)) problems.push(`does not name "${c.field}": ${named.slice(0, 160)}`);
			}
			if (problems.length) wrong.push(`${c.name}: ${problems.join('; ')}`);
		}
		expect(wrong).toEqual([]);
	});
});
