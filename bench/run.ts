// Frame: ISO 8855 vehicle axes (x forward, y left, z up); benches report figures only, never assert on time.
// Runs every bench module in turn and prints its figures (`npm run bench`, or `npm run bench -- NAME…`). Add new benches to BENCHES.

import * as fixSearch from './fix-search';
import * as kinematics from './kinematics';
import * as sharing from './sharing';
import * as shareLoad from './share-load';
import * as tolerance from './tolerance';
import * as workspace from './workspace';

/** A bench module: a name and a function that prints its figures. */
interface Bench {
	run: () => void | Promise<void>;
}

const BENCHES: [string, Bench][] = [
	['kinematics', kinematics],
	['fix-search', fixSearch],
	['tolerance', tolerance],
	['workspace', workspace],
	['sharing', sharing],
	['share-load', shareLoad]
];

// `npm run bench -- workspace sharing` runs the named parts only.
const wanted = process.argv.slice(2);
for (const [name, bench] of BENCHES.filter(([n]) => wanted.length === 0 || wanted.includes(n))) {
	console.log(`\n== ${name}`);
	await bench.run();
}
