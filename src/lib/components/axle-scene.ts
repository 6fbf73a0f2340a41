// The axle in 3-D: both corners' links (the kind's diagram lines), both wheels as discs and a body outline,
// at one solved position of a steer sweep. Vehicle axes (x forward, y left, z up, mm) map to three's world as
// (y, z, x), as in linkage-scene.ts. Renders only on change.
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
	DoubleSide
} from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { readPalette, toWorld } from './linkage/basics';

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
}

export interface AxleScene {
	setData(data: AxleSceneData): void;
	setPose(index: number): void;
	resize(width: number, height: number): void;
	dispose(): void;
}

const world = (p: Vec3, out = new Vector3()) => toWorld(p, out);

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
	camera.position.set(1400, 1100, 2200);
	const controls = new OrbitControls(camera, canvas);
	controls.enableDamping = false;
	let data: AxleSceneData | null = null;
	let group = new Group();
	scene.add(group);
	const linkMaterial = new LineBasicMaterial({ color: palette.accent });
	const bodyMaterial = new LineBasicMaterial({ color: palette.muted });
	const tyreMaterial = new MeshStandardMaterial({ color: palette.ink, transparent: true, opacity: 0.3, roughness: 0.9, side: DoubleSide, depthWrite: false });
	const disc = new CylinderGeometry(1, 1, 1, 40, 1, true);
	let width = 1;
	let height = 1;
	let half = 900;
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

	function wheel(side: SideFrame, radius: number) {
		const axisInner = side.points['wheel.axis_inner'];
		const c = world(side.wheel_centre);
		const mesh = new Mesh(disc, tyreMaterial);
		mesh.scale.set(radius, 180, radius); // a tyre about 180 mm wide
		const axis = axisInner ? c.clone().sub(world(axisInner)).normalize() : new Vector3(1, 0, 0);
		mesh.quaternion.copy(new Quaternion().setFromUnitVectors(new Vector3(0, 1, 0), axis));
		mesh.position.copy(c);
		return mesh;
	}

	function build(index: number) {
		if (!data) return;
		const f = data.frames[Math.max(0, Math.min(index, data.frames.length - 1))];
		if (!f) return;
		scene.remove(group);
		group.traverse((o) => {
			if (o instanceof LineSegments) o.geometry.dispose();
		});
		group = new Group();
		for (const side of ['left', 'right'] as const) {
			const pts = f[side].points;
			const pairs = data.lines[side].filter(([a, b]) => pts[a] && pts[b]).map(([a, b]) => [pts[a], pts[b]] as [Vec3, Vec3]);
			group.add(segments(pairs, linkMaterial));
			group.add(wheel(f[side], data.loadedRadius[side]));
		}
		// the body outline: a box through the chassis-side points of both corners (inner pivots, rack ends)
		const inner = Object.entries(f.left.points)
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

	return {
		setData(d) {
			data = d;
			const f = d.frames[Math.floor(d.frames.length / 2)];
			if (f) {
				const mid = world([(f.left.wheel_centre[0] + f.right.wheel_centre[0]) / 2, 0, f.left.wheel_centre[2]]);
				controls.target.copy(mid);
				camera.position.copy(mid.clone().add(new Vector3(1400, 1100, 2200)));
				half = Math.abs(f.left.wheel_centre[1] - f.right.wheel_centre[1]) * 0.42;
				frameCamera();
				controls.update();
			}
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
			disc.dispose();
			renderer.dispose();
		}
	};
}
