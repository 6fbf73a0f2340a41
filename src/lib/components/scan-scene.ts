// The scan view's 3-D scene: the scan's preview mesh placed in vehicle axes by its unit and alignment, the corner's
// current linkage overlaid (the 3-D view's RevisionRig), orbit, a section plane along a vehicle axis, picking on the
// surface (three-mesh-bvh) and markers for the pick, the patch, the fit and the assigned points.
// Frame: ISO 8855 vehicle axes (mm) drawn in three's world as (y, z, x), as in linkage-scene.ts. The scan's own
// coordinates (file units) go through M = [R·s | t] to vehicle axes, then to three's world.
import {
	AmbientLight,
	BufferAttribute,
	BufferGeometry,
	Color,
	CylinderGeometry,
	DirectionalLight,
	DoubleSide,
	Float32BufferAttribute,
	Group,
	Matrix4,
	Mesh,
	MeshBasicMaterial,
	MeshStandardMaterial,
	OctahedronGeometry,
	PerspectiveCamera,
	Plane,
	Points,
	PointsMaterial,
	Raycaster,
	Scene,
	SphereGeometry,
	SRGBColorSpace,
	Vector2,
	Vector3,
	WebGLRenderer,
	type Sprite
} from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { acceleratedRaycast, computeBoundsTree, disposeBoundsTree } from 'three-mesh-bvh';
import type { PreviewMesh } from '$lib/mesh/preview';
import { readPalette, toWorld } from './linkage/basics';
import { RevisionRig } from './linkage/rig';
import type { CornerKind, Frame, Vec3 } from './linkage/types';

BufferGeometry.prototype.computeBoundsTree = computeBoundsTree;
BufferGeometry.prototype.disposeBoundsTree = disposeBoundsTree;
Mesh.prototype.raycast = acceleratedRaycast;

/** Scan file coordinates → vehicle axes (mm): p ↦ R (s p) + t. */
export interface ScanPlacement {
	scale: number;
	R: [Vec3, Vec3, Vec3];
	t: Vec3;
}

export type SectionAxis = 'x' | 'y' | 'z';

export interface ScanScene {
	setPlacement(p: ScanPlacement): void;
	setOverlay(kind: CornerKind, frame: Frame | null, loadedRadius: number): void;
	setSection(axis: SectionAxis | null, offsetMm: number): void;
	/** markers in vehicle axes: the pick, the patch (file coordinates), the fit, the assigned points */
	setMarkers(m: { pick?: Vec3 | null; patch?: Float64Array | null; fit?: { centre: Vec3; radius: number } | null; assigned?: Vec3[] }): void;
	/** the three-world to screen position of a vehicle point (tests click through it) */
	screenOf(p: Vec3): { x: number; y: number };
	resize(width: number, height: number): void;
	dispose(): void;
}

/** Placement matrix into three's world: world = P · [R s | t] · file, P the (x, y, z) → (y, z, x) permutation. */
function worldMatrix(p: ScanPlacement): Matrix4 {
	const { R, t, scale: s } = p;
	// rows of vehicle = R s; world rows = vehicle rows (y, z, x)
	const row = (i: number) => [R[i][0] * s, R[i][1] * s, R[i][2] * s, t[i]];
	const [rx, ry, rz] = [row(0), row(1), row(2)];
	return new Matrix4().set(...(ry as [number, number, number, number]), ...(rz as [number, number, number, number]), ...(rx as [number, number, number, number]), 0, 0, 0, 1);
}

export function createScanScene(
	canvas: HTMLCanvasElement,
	preview: PreviewMesh,
	onPick: (file: Vec3 | null, vehicle: Vec3 | null) => void
): ScanScene {
	const renderer = new WebGLRenderer({ canvas, antialias: true, preserveDrawingBuffer: true });
	renderer.setPixelRatio(Math.min(window.devicePixelRatio || 1, 2));
	renderer.outputColorSpace = SRGBColorSpace;
	renderer.localClippingEnabled = true;
	const palette = readPalette();
	const scene = new Scene();
	scene.background = palette.panel;
	scene.add(new AmbientLight(0xffffff, 1.1));
	const sun = new DirectionalLight(0xffffff, 1.6);
	sun.position.set(800, 1500, 1200);
	scene.add(sun);
	const camera = new PerspectiveCamera(40, 1, 1, 200000);
	const controls = new OrbitControls(camera, canvas);
	controls.enableDamping = false;

	// the scan
	const geometry = new BufferGeometry();
	geometry.setAttribute('position', new BufferAttribute(preview.positions, 3));
	geometry.setIndex(new BufferAttribute(preview.indices, 1));
	geometry.computeVertexNormals();
	geometry.computeBoundsTree();
	const section = new Plane(new Vector3(1, 0, 0), 0);
	const scanMaterial = new MeshStandardMaterial({ color: new Color(0xb8bcc4), roughness: 0.75, metalness: 0.05, side: DoubleSide, clippingPlanes: [] });
	const scan = new Mesh(geometry, scanMaterial);
	scan.matrixAutoUpdate = false;
	scene.add(scan);

	// the linkage overlay
	const shared = { sphere: new SphereGeometry(1, 16, 12), cylinder: new CylinderGeometry(1, 1, 1, 12), octahedron: new OctahedronGeometry(1) };
	const sprites = new Set<Sprite>();
	let rig: RevisionRig | null = null;

	// markers
	const markers = new Group();
	scene.add(markers);
	const pickMat = new MeshBasicMaterial({ color: palette.warn, depthTest: false });
	const fitMat = new MeshBasicMaterial({ color: palette.accent, transparent: true, opacity: 0.35, depthWrite: false });
	const assignedMat = new MeshBasicMaterial({ color: palette.good, depthTest: false });
	const patchMat = new PointsMaterial({ color: palette.accent, size: 3, sizeAttenuation: false, depthTest: false });

	let placement: ScanPlacement = { scale: 1, R: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], t: [0, 0, 0] };
	let width = 1;
	let height = 1;
	let pending = 0;
	function render() {
		if (pending) return;
		pending = requestAnimationFrame(() => {
			pending = 0;
			renderer.render(scene, camera);
		});
	}
	controls.addEventListener('change', render);

	function frameCamera() {
		scan.updateMatrixWorld(true);
		geometry.computeBoundingSphere();
		const sphere = geometry.boundingSphere!.clone().applyMatrix4(scan.matrixWorld);
		controls.target.copy(sphere.center);
		const dist = sphere.radius / Math.sin((camera.fov * Math.PI) / 360) * 1.1;
		camera.position.copy(sphere.center).add(new Vector3(0.55, 0.45, 0.7).normalize().multiplyScalar(dist));
		camera.near = Math.max(0.1, dist / 1000);
		camera.far = dist * 20;
		camera.updateProjectionMatrix();
		controls.update();
	}

	function worldOfVehicle(p: Vec3) {
		return toWorld(p, new Vector3());
	}
	function vehicleOfWorld(w: Vector3): Vec3 {
		return [w.z, w.x, w.y];
	}

	// picking: a click that did not drag
	const raycaster = new Raycaster();
	let down: { x: number; y: number } | null = null;
	canvas.addEventListener('pointerdown', (e) => (down = { x: e.clientX, y: e.clientY }));
	canvas.addEventListener('pointerup', (e) => {
		if (!down || Math.hypot(e.clientX - down.x, e.clientY - down.y) > 4) return;
		down = null;
		const rect = canvas.getBoundingClientRect();
		const ndc = new Vector2(((e.clientX - rect.left) / rect.width) * 2 - 1, -((e.clientY - rect.top) / rect.height) * 2 + 1);
		raycaster.setFromCamera(ndc, camera);
		const planes = scanMaterial.clippingPlanes ?? [];
		(raycaster as Raycaster & { firstHitOnly?: boolean }).firstHitOnly = planes.length === 0;
		const hits = raycaster.intersectObject(scan, false).filter((h) => planes.every((pl) => pl.distanceToPoint(h.point) >= 0));
		const hit = hits[0];
		if (!hit) return onPick(null, null);
		const local = hit.point.clone().applyMatrix4(new Matrix4().copy(scan.matrixWorld).invert());
		onPick([local.x, local.y, local.z], vehicleOfWorld(hit.point));
	});

	const api: ScanScene = {
		setPlacement(p) {
			placement = p;
			scan.matrix.copy(worldMatrix(p));
			scan.matrixWorldNeedsUpdate = true;
			frameCamera();
			render();
		},
		setOverlay(kind, frame, loadedRadius) {
			if (rig) {
				scene.remove(rig.group);
				rig = null;
			}
			if (frame) {
				rig = new RevisionRig(
					kind,
					Object.keys(frame.points),
					loadedRadius,
					{ link: palette.accent, joint: palette.accent, pivot: palette.ink, marker: palette.warn, opacity: 0.55, ghost: true },
					shared,
					sprites,
					palette.warn
				);
				rig.pose(frame, null);
				scene.add(rig.group);
			}
			render();
		},
		setSection(axis, offset) {
			if (!axis) scanMaterial.clippingPlanes = [];
			else {
				// keep the side below the offset along the vehicle axis (x forward, y left, z up)
				const n: Vec3 = axis === 'x' ? [-1, 0, 0] : axis === 'y' ? [0, -1, 0] : [0, 0, -1];
				section.normal.copy(worldOfVehicle(n));
				section.constant = offset;
				scanMaterial.clippingPlanes = [section];
			}
			scanMaterial.needsUpdate = true;
			render();
		},
		setMarkers(m) {
			for (const c of [...markers.children]) {
				markers.remove(c);
				if (c instanceof Points) c.geometry.dispose();
			}
			if (m.pick) {
				const s = new Mesh(shared.sphere, pickMat);
				s.position.copy(worldOfVehicle(m.pick));
				s.scale.setScalar(3);
				s.renderOrder = 10;
				markers.add(s);
			}
			if (m.patch && m.patch.length) {
				const g = new BufferGeometry();
				g.setAttribute('position', new Float32BufferAttribute(Float32Array.from(m.patch), 3));
				const pts = new Points(g, patchMat);
				pts.matrixAutoUpdate = false;
				pts.matrix.copy(worldMatrix(placement));
				pts.renderOrder = 9;
				markers.add(pts);
			}
			if (m.fit) {
				const s = new Mesh(shared.sphere, fitMat);
				s.position.copy(worldOfVehicle(m.fit.centre));
				s.scale.setScalar(Math.max(1, m.fit.radius));
				markers.add(s);
				const c = new Mesh(shared.octahedron, pickMat);
				c.position.copy(worldOfVehicle(m.fit.centre));
				c.scale.setScalar(4);
				c.renderOrder = 10;
				markers.add(c);
			}
			for (const a of m.assigned ?? []) {
				const s = new Mesh(shared.octahedron, assignedMat);
				s.position.copy(worldOfVehicle(a));
				s.scale.setScalar(6);
				s.renderOrder = 10;
				markers.add(s);
			}
			render();
		},
		screenOf(p) {
			const v = worldOfVehicle(p).project(camera);
			const rect = canvas.getBoundingClientRect();
			return { x: rect.left + ((v.x + 1) / 2) * rect.width, y: rect.top + ((1 - v.y) / 2) * rect.height };
		},
		resize(w, h) {
			width = Math.max(1, w);
			height = Math.max(1, h);
			renderer.setSize(width, height, false);
			camera.aspect = width / height;
			camera.updateProjectionMatrix();
			render();
		},
		dispose() {
			cancelAnimationFrame(pending);
			controls.dispose();
			geometry.disposeBoundsTree();
			geometry.dispose();
			for (const g of Object.values(shared)) g.dispose();
			renderer.dispose();
		}
	};
	return api;
}
