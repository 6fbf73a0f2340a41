// The car in 3-D: the front axle's corners (the kind's diagram lines) and wheels at one solved position of a steer
// sweep, and, when given, the rear axle at design (its corners' links, or a solid axle's housing, links and lateral
// locator) and the body (a hull outline, the sprung mass items, the CG). Without a rear axle and body it draws the
// steered axle alone with a box through its chassis points. Vehicle axes (x forward, y left, z up, mm) map to
// three's world as (y, z, x), as in linkage-scene.ts. Every position comes from the server's solve; this file only
// draws. Renders only on change.
import {
	BufferGeometry,
	CylinderGeometry,
	Float32BufferAttribute,
	Group,
	LineBasicMaterial,
	LineSegments,
	Mesh,
	MeshStandardMaterial,
	OrthographicCamera,
	Quaternion,
	Scene,
	SRGBColorSpace,
	Vector3,
	WebGLRenderer,
	AmbientLight,
	DirectionalLight,
	DoubleSide,
	SphereGeometry,
	Sprite,
	type Object3D
} from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { placeRod, readPalette, toWorld } from './linkage/basics';
import { makeLabel, sizeLabels } from './linkage/labels';
import type { SceneAxle, SceneBody } from './linkage/types';

export type Vec3 = [number, number, number];

/** One side at one position: its solved points, wheel centre and contact point. */
export interface SideFrame {
	points: Record<string, Vec3>;
	wheel_centre: Vec3;
	contact_patch: Vec3;
}

export interface AxleSceneData {
	frames: { left: SideFrame; right: SideFrame }[];
	/** each side's lines as pairs of point names (the kind's diagram) */
	lines: { left: readonly (readonly [string, string])[]; right: readonly (readonly [string, string])[] };
	loadedRadius: { left: number; right: number };
	/** the rear axle at design, drawn still */
	rear?: SceneAxle | null;
	/** the body outline, mass items and CG */
	body?: SceneBody | null;
}

export interface AxleScene {
	setData(data: AxleSceneData): void;
	setPose(index: number): void;
	resize(width: number, height: number): void;
	dispose(): void;
}

const world = (p: Vec3, out = new Vector3()) => toWorld(p, out);

/** Free what a group made for itself: its own line geometries, its labels' textures (shared meshes and materials stay). */
function free(root: Object3D, shared: Set<BufferGeometry>, sprites: Set<Sprite>) {
	root.traverse((o) => {
		if (o instanceof LineSegments && !shared.has(o.geometry)) o.geometry.dispose();
		if (o instanceof Sprite) {
			o.material.map?.dispose();
			o.material.dispose();
			sprites.delete(o);
		}
	});
}

export function createAxleScene(canvas: HTMLCanvasElement): AxleScene {
	const renderer = new WebGLRenderer({ canvas, antialias: true, preserveDrawingBuffer: true });
	renderer.setPixelRatio(Math.min(window.devicePixelRatio || 1, 2));
	renderer.outputColorSpace = SRGBColorSpace;
	const palette = readPalette();
	const scene = new Scene();
	scene.background = palette.panel;
	scene.add(new AmbientLight(0xffffff, 1.6));
	const sun = new DirectionalLight(0xffffff, 1.4);
	sun.position.set(500, 1500, 1200);
	scene.add(sun);
	const camera = new OrthographicCamera(-1, 1, 1, -1, -100000, 100000);
	// a three-quarter view from ahead, above and to the left
	const VIEW = new Vector3(1400, 1100, 2200).normalize().multiplyScalar(4000);
	camera.position.copy(VIEW);
	const controls = new OrbitControls(camera, canvas);
	controls.enableDamping = false;
	let data: AxleSceneData | null = null;
	let group = new Group();
	let still = new Group();
	scene.add(group, still);
	const linkMaterial = new LineBasicMaterial({ color: palette.accent });
	const bodyMaterial = new LineBasicMaterial({ color: palette.muted });
	const tyreMaterial = new MeshStandardMaterial({ color: palette.ink, transparent: true, opacity: 0.3, roughness: 0.9, side: DoubleSide, depthWrite: false });
	const housingMaterial = new MeshStandardMaterial({ color: palette.accent, roughness: 0.6 });
	const itemMaterial = new MeshStandardMaterial({ color: palette.muted, roughness: 0.8 });
	const cgMaterial = new MeshStandardMaterial({ color: palette.warn, roughness: 0.5 });
	const disc = new CylinderGeometry(1, 1, 1, 40, 1, true);
	const rod = new CylinderGeometry(1, 1, 1, 12);
	const ball = new SphereGeometry(1, 16, 12);
	const shared = new Set<BufferGeometry>([disc, rod, ball]);
	const sprites = new Set<Sprite>();
	let width = 1;
	let height = 1;
	let half = 900;
	let pending = 0;

	function render() {
		if (pending) return;
		pending = requestAnimationFrame(() => {
			pending = 0;
			sizeLabels(sprites, (camera.top - camera.bottom) / camera.zoom / Math.max(1, height));
			renderer.render(scene, camera);
		});
	}
	controls.addEventListener('change', render);

	function frameCamera() {
		const aspect = width / Math.max(1, height);
		camera.left = -half * aspect;
		camera.right = half * aspect;
		camera.top = half;
		camera.bottom = -half;
		camera.updateProjectionMatrix();
	}

	function segments(pairs: [Vec3, Vec3][], material: LineBasicMaterial) {
		const g = new BufferGeometry();
		const a: number[] = [];
		const v = new Vector3();
		for (const [p, q] of pairs) {
			world(p, v);
			a.push(v.x, v.y, v.z);
			world(q, v);
			a.push(v.x, v.y, v.z);
		}
		g.setAttribute('position', new Float32BufferAttribute(a, 3));
		return new LineSegments(g, material);
	}

	/** A tyre about 180 mm wide on the wheel's spin axis (centre → inboard point). */
	function wheelMesh(centre: Vec3, axisInner: Vec3 | undefined, radius: number) {
		const c = world(centre);
		const mesh = new Mesh(disc, tyreMaterial);
		mesh.scale.set(radius, 180, radius);
		const axis = axisInner ? c.clone().sub(world(axisInner)).normalize() : new Vector3(1, 0, 0);
		mesh.quaternion.copy(new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), axis));
		mesh.position.copy(c);
		return mesh;
	}

	function wheel(side: SideFrame, radius: number) {
		return wheelMesh(side.wheel_centre, side.points['wheel.axis_inner'], radius);
	}

	/** The rear axle, the body outline, the mass items and the CG: drawn once per data. */
	function buildStill(d: AxleSceneData) {
		scene.remove(still);
		free(still, shared, sprites);
		still = new Group();
		if (d.rear) {
			still.add(segments(d.rear.links, linkMaterial));
			// the axle tube first, then the link brackets on the housing, thinner
			for (const [i, [p, q]] of d.rear.housing.entries()) {
				const m = new Mesh(rod, housingMaterial);
				placeRod(m, world(p), world(q), i === 0 ? 28 : 12);
				still.add(m);
			}
			for (const w of d.rear.wheels) still.add(wheelMesh(w.centre, w.axis_inner, w.radius));
		}
		if (d.body) {
			const { plan, floor, top, cg, items } = d.body;
			const edges: [Vec3, Vec3][] = [];
			plan.forEach(([x, y], i) => {
				const [nx, ny] = plan[(i + 1) % plan.length];
				edges.push([[x, y, floor], [nx, ny, floor]], [[x, y, top], [nx, ny, top]], [[x, y, floor], [x, y, top]]);
			});
			still.add(segments(edges, bodyMaterial));
			const heaviest = Math.max(...items.map((i) => i.mass), 1);
			for (const item of items) {
				const m = new Mesh(ball, itemMaterial);
				m.scale.setScalar(25 + 45 * Math.cbrt(item.mass / heaviest));
				m.position.copy(world(item.at));
				still.add(m);
			}
			const c = new Mesh(ball, cgMaterial);
			c.scale.setScalar(40);
			c.position.copy(world(cg));
			still.add(c);
			// a plumb line from the CG to the ground
			still.add(segments([[cg, [cg[0], cg[1], 0]]], bodyMaterial));
			const label = makeLabel('CG', palette.warn, sprites);
			label.position.copy(world([cg[0], cg[1] - 120, cg[2] + 140]));
			still.add(label);
			// which way is forward
			const nose = Math.max(...plan.map((p) => p[0]));
			const ahead = makeLabel('front', palette.muted, sprites);
			ahead.position.copy(world([nose + 150, 0, top]));
			still.add(ahead);
		}
		scene.add(still);
	}

	function build(index: number) {
		if (!data) return;
		const f = data.frames[Math.max(0, Math.min(index, data.frames.length - 1))];
		if (!f) return;
		scene.remove(group);
		free(group, shared, sprites);
		group = new Group();
		for (const side of ['left', 'right'] as const) {
			const pts = f[side].points;
			const pairs = data.lines[side].filter(([a, b]) => pts[a] && pts[b]).map(([a, b]) => [pts[a], pts[b]] as [Vec3, Vec3]);
			group.add(segments(pairs, linkMaterial));
			group.add(wheel(f[side], data.loadedRadius[side]));
		}
		// the steered axle alone: a box through the chassis-side points of both corners (inner pivots, rack ends)
		const inner = data.body
			? []
			: Object.entries(f.left.points)
					.concat(Object.entries(f.right.points))
					.filter(([n]) => /front|rear|inner|chassis|pivot/.test(n) && !/outer/.test(n))
					.map(([, p]) => p);
		if (inner.length) {
			const lo = [0, 1, 2].map((i) => Math.min(...inner.map((p) => p[i])));
			const hi = [0, 1, 2].map((i) => Math.max(...inner.map((p) => p[i])));
			const c = (x: number, y: number, z: number): Vec3 => [x ? hi[0] : lo[0], y ? hi[1] : lo[1], z ? hi[2] : lo[2]];
			const edges: [Vec3, Vec3][] = [];
			for (const [a, b] of [[0, 1], [2, 3], [4, 5], [6, 7], [0, 2], [1, 3], [4, 6], [5, 7], [0, 4], [1, 5], [2, 6], [3, 7]]) {
				const bits = (n: number) => [n & 1, (n >> 1) & 1, (n >> 2) & 1] as const;
				edges.push([c(...bits(a)), c(...bits(b))]);
			}
			group.add(segments(edges, bodyMaterial));
		}
		scene.add(group);
		render();
	}

	/** Aim at the middle of what is drawn: the front axle alone, or the whole car. */
	function aim(d: AxleSceneData) {
		const f = d.frames[Math.floor(d.frames.length / 2)];
		if (!f) return;
		const fx = (f.left.wheel_centre[0] + f.right.wheel_centre[0]) / 2;
		const track = Math.abs(f.left.wheel_centre[1] - f.right.wheel_centre[1]);
		const rx = d.rear ? (d.rear.wheels[0].centre[0] + d.rear.wheels[1].centre[0]) / 2 : fx;
		const mid = world([(fx + rx) / 2, 0, f.left.wheel_centre[2]]);
		controls.target.copy(mid);
		camera.position.copy(mid.clone().add(VIEW));
		half = d.rear ? Math.max(track, Math.abs(fx - rx)) * 0.4 : track * 0.42;
		frameCamera();
		controls.update();
	}

	return {
		setData(d) {
			data = d;
			aim(d);
			buildStill(d);
			build(Math.floor(d.frames.length / 2));
		},
		setPose(index) {
			build(index);
		},
		resize(w, h) {
			width = w;
			height = h;
			renderer.setSize(w, h, false);
			frameCamera();
			render();
		},
		dispose() {
			cancelAnimationFrame(pending);
			controls.dispose();
			free(group, shared, sprites);
			free(still, shared, sprites);
			for (const g of shared) g.dispose();
			for (const m of [linkMaterial, bodyMaterial, tyreMaterial, housingMaterial, itemMaterial, cgMaterial]) m.dispose();
			renderer.dispose();
		}
	};
}
