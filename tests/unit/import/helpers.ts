// Frame: ISO 8855 vehicle axes, x forward, y left, z up; lengths in mm.
// Shared helpers for the import tests: fixtures, CSV text built from points, distances.

import { readFileSync } from 'node:fs';
import { join } from 'node:path';

export type P = [number, number, number];
export const ROOT = join(import.meta.dirname, '..', '..', '..');

/** A fixture file's bytes. */
export function fixtureBytes(name: string): Uint8Array {
	return new Uint8Array(readFileSync(join(ROOT, 'fixtures', name)));
}

/** The points of a corner fixture (without .json). */
export function fixturePoints(name: string): Record<string, P> {
	return JSON.parse(readFileSync(join(ROOT, 'fixtures', `${name}.json`), 'utf8')).points as Record<string, P>;
}

/** The demo car's stock front-left points (mm). */
export const STOCK = fixturePoints('club-fwd-front-left');

/** UTF-8 bytes of a text. */
export const bytes = (text: string): Uint8Array => new TextEncoder().encode(text);

/** A `name,x,y,z` CSV of points (any unit), full precision. */
export function csvOf(points: Record<string, P>, header = 'name,x,y,z'): string {
	const lines = Object.entries(points).map(([n, p]) => [n, ...p.map((v) => String(v))].join(','));
	return [header, ...lines].join('\n') + '\n';
}

/** |a − b| (mm), written here independently of the code under test. */
export function distance(a: number[], b: number[]): number {
	return Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
}

/** Largest |got[n] − want[n]| over want's names (mm); Infinity when a name is missing. */
export function maxError(got: Record<string, number[]>, want: Record<string, P>): number {
	return Math.max(...Object.entries(want).map(([n, p]) => (got[n] ? distance(got[n], p) : Infinity)));
}

/** A copy of points without some names. */
export function without(points: Record<string, P>, ...names: string[]): Record<string, P> {
	return Object.fromEntries(Object.entries(points).filter(([n]) => !names.includes(n)));
}
