// three.js basics shared by the 3-D view's parts: the theme's colours, vehicle axes to three's, rods and segments
// placed between two points, freeing what a group holds. GPU buffers are Float32 by necessity; the geometry itself
// stays in the solver's numbers.
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, millimetres, z = 0 the ground.
// three.js is y-up, so every vehicle point (x, y, z) is drawn at three (X, Y, Z) = (y, z, x): a cyclic permutation,
// hence still right-handed, with vehicle z up on screen. One three unit is one millimetre.
import { Color, CylinderGeometry, Float32BufferAttribute, Line, Mesh, OctahedronGeometry, Object3D, Quaternion, SphereGeometry, SpriteMaterial, SRGBColorSpace, Vector3, type BufferGeometry, type Material } from 'three';
import type { Vec3 } from './types';

const TOKENS = ['surface', 'panel', 'sunken', 'ink', 'muted', 'line', 'accent', 'good', 'warn', 'bad'] as const;
export type Palette = Record<(typeof TOKENS)[number], Color>;

/** The theme tokens (`--lw-*`, "r g b" triples) of the page as three colours. */
export function readPalette(): Palette {
	const style = getComputedStyle(document.documentElement);
	const out = {} as Palette;
	for (const name of TOKENS) {
		const [r, g, b] = style.getPropertyValue(`--lw-${name}`).trim().split(/[\s,]+/).map(Number);
		out[name] = [r, g, b].every(Number.isFinite) ? new Color().setRGB(r / 255, g / 255, b / 255, SRGBColorSpace) : new Color(0x808080);
	}
	return out;
}

/** Vehicle point (mm) to three world, written into out. */
export function toWorld(p: Vec3, out: Vector3): Vector3 {
	return out.set(p[1], p[2], p[0]);
}

export const scratchA = new Vector3();
export const scratchB = new Vector3();
const scratchQ = new Quaternion();
export const Y_AXIS = new Vector3(0, 1, 0);

/** Place a unit-height cylinder (axis along Y, centred) between a and b (world). */
export function placeRod(rod: Object3D, a: Vector3, b: Vector3, radius: number) {
	const len = a.distanceTo(b);
	rod.visible = len > 1e-6;
	if (!rod.visible) return;
	rod.position.copy(a).add(b).multiplyScalar(0.5);
	scratchQ.setFromUnitVectors(Y_AXIS, scratchB.copy(b).sub(a).divideScalar(len));
	rod.quaternion.copy(scratchQ);
	rod.scale.set(radius, len, radius);
}

/** Free every geometry, material and texture under root (shared geometries excepted). */
export function disposeTree(root: Object3D, keep: Set<BufferGeometry>) {
	root.traverse((o) => {
		const m = o as Mesh;
		if (m.geometry && !keep.has(m.geometry)) m.geometry.dispose();
		const mats = m.material ? (Array.isArray(m.material) ? m.material : [m.material]) : [];
		for (const mat of mats as Material[]) {
			const map = (mat as SpriteMaterial).map;
			map?.dispose();
			mat.dispose();
		}
	});
}

/** Point a two-point line at a → b, hidden when b is null. */
export function setSegment(line: Line, a: Vector3, b: Vector3 | null) {
	line.visible = !!b;
	if (!b) return;
	const attr = line.geometry.getAttribute('position') as Float32BufferAttribute;
	attr.setXYZ(0, a.x, a.y, a.z);
	attr.setXYZ(1, b.x, b.y, b.z);
	attr.needsUpdate = true;
	line.geometry.computeBoundingSphere();
	line.computeLineDistances();
}

/** The unit meshes every rig and the triad scale per use (freed once, with the scene). */
export interface SharedGeometry {
	sphere: SphereGeometry;
	cylinder: CylinderGeometry;
	octahedron: OctahedronGeometry;
}
