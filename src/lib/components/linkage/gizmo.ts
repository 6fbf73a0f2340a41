// The vehicle-axes triad: its own small scene, drawn in the lower-left corner with the main camera's orientation,
// always visible, never in the way of the linkage or the roll centre.
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, millimetres, z = 0 the ground.
// three.js is y-up, so every vehicle point (x, y, z) is drawn at three (X, Y, Z) = (y, z, x): a cyclic permutation,
// hence still right-handed, with vehicle z up on screen. One three unit is one millimetre.
import { AmbientLight, CylinderGeometry, Mesh, MeshBasicMaterial, OrthographicCamera, Quaternion, Scene, Vector3, type BufferGeometry, type Camera, type Color, type Sprite, type WebGLRenderer } from 'three';
import { disposeTree, placeRod, toWorld, Y_AXIS, type SharedGeometry } from './basics';
import { LABEL_PX, makeLabel } from './labels';
import type { Vec3 } from './types';

const GIZMO_PX = 170; // CSS pixels: side of the axes-triad inset
/** Where the triad and its labels are drawn in a view `height` CSS px tall (bottom-left), for the labels to avoid. */
export function triadBox(height: number) {
	const cx = 4 + GIZMO_PX / 2;
	const cy = height - 4 - GIZMO_PX / 2;
	return { x: cx - 65, y: cy - 62, w: 130, h: 124 };
}
const GIZMO_HALF = 2.1; // triad inset half-size in arrow lengths (room for the labels)

/** The axes triad of the 3-D view. */
export class AxesTriad {
	private readonly gizmo = new Scene();
	private readonly gizmoCamera = new OrthographicCamera(-GIZMO_HALF, GIZMO_HALF, GIZMO_HALF, -GIZMO_HALF, -10, 10);
	private gizmoLabels: { sprite: Sprite; tip: Vector3 }[] = [];
	private readonly viewSpace = new Vector3();
	private readonly inverse = new Quaternion();

	constructor(
		private readonly shared: SharedGeometry,
		private readonly keep: Set<BufferGeometry>
	) {
		this.gizmo.add(new AmbientLight(0xffffff, 2.2));
	}

	/** Labels at the arrow tips; an axis pointing at the viewer gets its label just below the origin instead. */
	private placeLabels(camera: Camera) {
		this.inverse.copy(camera.quaternion).invert();
		for (const { sprite, tip } of this.gizmoLabels) {
			this.viewSpace.copy(tip).applyQuaternion(this.inverse);
			if (Math.hypot(this.viewSpace.x, this.viewSpace.y) > 0.35) sprite.position.copy(tip).multiplyScalar(1.32);
			else sprite.position.set(0, -0.42, 0).applyQuaternion(camera.quaternion);
		}
	}

	/** (Re)build the triad in colour `ink`: unit arrows along vehicle x, y and z. */
	build(ink: Color) {
		const gizmo = this.gizmo;
		for (const child of [...gizmo.children]) {
			if (child instanceof AmbientLight) continue;
			gizmo.remove(child);
			disposeTree(child, this.keep);
		}
		const mat = new MeshBasicMaterial({ color: ink });
		const o = new Vector3();
		const axes: [Vec3, string][] = [
			[[1, 0, 0], 'x forward'],
			[[0, 1, 0], 'y left'],
			[[0, 0, 1], 'z up']
		];
		const perPx = (2 * GIZMO_HALF) / GIZMO_PX;
		this.gizmoLabels = [];
		for (const [d, label] of axes) {
			const tip = toWorld(d, new Vector3());
			const shaft = new Mesh(this.shared.cylinder, mat);
			placeRod(shaft, o.clone(), tip.clone().multiplyScalar(0.82), 0.035);
			const head = new Mesh(new CylinderGeometry(0, 0.09, 0.22, 12), mat);
			head.position.copy(tip).multiplyScalar(0.89);
			head.quaternion.setFromUnitVectors(Y_AXIS, tip);
			const text = makeLabel(label, ink, new Set());
			const h = LABEL_PX * 1.25 * perPx;
			text.center.set(0.5, 0.5);
			text.scale.set(h * text.userData.aspect, h, 1);
			this.gizmoLabels.push({ sprite: text, tip });
			gizmo.add(shaft, head, text);
		}
	}

	/** Draw the triad over what `renderer` holds, turned as `camera` is (the caller restores its viewport). */
	render(renderer: WebGLRenderer, camera: Camera) {
		this.gizmoCamera.quaternion.copy(camera.quaternion);
		this.placeLabels(camera);
		this.gizmoCamera.position.set(0, 0, 5).applyQuaternion(camera.quaternion);
		renderer.clearDepth();
		renderer.setScissorTest(true);
		renderer.setScissor(4, 4, GIZMO_PX, GIZMO_PX);
		renderer.setViewport(4, 4, GIZMO_PX, GIZMO_PX);
		renderer.render(this.gizmo, this.gizmoCamera);
	}

	/** Free the triad's objects. */
	dispose() {
		disposeTree(this.gizmo, this.keep);
	}
}
