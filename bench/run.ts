// Frame: ISO 8855 vehicle axes (x forward, y left, z up); benches report figures only, never assert on time.
// Runs every bench module in turn and prints its figures (`npm run bench`, or `npm run bench -- NAME…`). Add new benches to BENCHES.

import { ensureBuild, ensureChromium, prepareDatabase } from '../scripts/setup.mjs';

/** A bench module: a function that prints its figures. */
interface Bench {
	run: () => void | Promise<void>;
}

// Each part is loaded when it runs, so the solver's figures are taken before the browser, database and mail
// clients of the later parts are loaded into the process (they change how the engine's code is optimised).
const BENCHES: [string, () => Promise<Bench>][] = [
	['kinematics', () => import('./kinematics')],
	['axle', () => import('./axle')],
	['solid-axle', () => import('./solid-axle')],
	['fix-search', () => import('./fix-search')],
	['tolerance', () => import('./tolerance')],
	['workspace', () => import('./workspace')],
	['car-page', () => import('./car-page')],
	['corner-page', () => import('./corner-page')],
	['sharing', () => import('./sharing')],
	['share-load', () => import('./share-load')],
	['scan', () => import('./scan')],
	['explore', () => import('./explore')]
];

/** Parts that drive the built app in Chromium against the test database. */
const IN_BROWSER = ['workspace', 'car-page', 'corner-page', 'sharing', 'scan'];
/** Parts that drive the built app over HTTP against the test database (no browser). */
const OVER_HTTP = ['share-load'];
/** Parts that need the test database only. */
const ON_DATABASE = ['explore'];

// `npm run bench -- workspace sharing` runs the named parts only.
const wanted = process.argv.slice(2);
const parts = BENCHES.filter(([n]) => wanted.length === 0 || wanted.includes(n));
// The same set-up as `npm test` for the parts that need it: Debian's Chromium, the build and the test database.
if (parts.some(([n]) => IN_BROWSER.includes(n))) ensureChromium();
if (parts.some(([n]) => IN_BROWSER.includes(n) || OVER_HTTP.includes(n))) {
	ensureBuild();
	prepareDatabase({ test: true });
} else if (parts.some(([n]) => ON_DATABASE.includes(n))) prepareDatabase({ test: true });
for (const [name, bench] of parts) {
	console.log(`\n== ${name}`);
	await (await bench()).run();
}
