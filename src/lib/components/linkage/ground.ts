// The statics of the 3-D view: the ground grid and the vehicle centreline around the corner.
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, millimetres, z = 0 the ground.
// three.js is y-up, so every vehicle point (x, y, z) is drawn at three (X, Y, Z) = (y, z, x): a cyclic permutation,
// hence still right-handed, with vehicle z up on screen. One three unit is one millimetre.
import { BufferGeometry, GridHelper, Group, Line, LineBasicMaterial, LineDashedMaterial, Vector3, type Sprite } from 'three';
import { toWorld, type Palette } from './basics';
import { makeLabel } from './labels';
import type { Frame } from './types';

/** Ground grid and centreline around the corner at frame f; its label is added to `sprites`. */
export function buildGround(f: Frame, palette: Palette, sprites: Set<Sprite>): Group {
	const statics = new Group();
	const wc = f.wheel_centre;
	const cell = 100;
	const span = Math.max(1600, Math.ceil((Math.abs(wc[1]) * 2 + 800) / 200) * 200);
	const grid = new GridHelper(span, span / cell, palette.line, palette.line);
	const gm = grid.material as LineBasicMaterial;
	gm.transparent = true;
	gm.opacity = 0.9;
	gm.depthWrite = false;
	grid.position.set(wc[1] / 2, 0, Math.round(wc[0] / cell) * cell);
	statics.add(grid);
	// vehicle centreline y = 0 on the ground
	const cl = new Line(
		new BufferGeometry().setFromPoints([toWorld([wc[0] - span / 2, 0, 0], new Vector3()), toWorld([wc[0] + span / 2, 0, 0], new Vector3())]),
		new LineDashedMaterial({ color: palette.muted, dashSize: 40, gapSize: 20 })
	);
	cl.computeLineDistances();
	statics.add(cl);
	const clLabel = makeLabel('centreline', palette.muted, sprites);
	clLabel.center.set(1.04, 0.5); // text ends at the line, so it stays clear of the roll centre in the front view
	clLabel.position.copy(toWorld([wc[0] + span / 2 - 60, 0, 0], new Vector3()));
	clLabel.userData.priority = 3;
	statics.add(clLabel);
	return statics;
}
