// The three.js scene behind LinkageView: loaded lazily (dynamic import) so pages without the view do not pay for three.
//
// GPU buffers are Float32 by necessity; the geometry itself stays in the solver's numbers.
//
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, millimetres, z = 0 the ground.
// three.js is y-up, so every vehicle point (x, y, z) is drawn at three (X, Y, Z) = (y, z, x): a cyclic permutation,
// hence still right-handed, with vehicle z up on screen. One three unit is one millimetre.
import { kindSpec } from '$lib/kinds';
import {
	AmbientLight,
	BufferGeometry,
	CanvasTexture,
	Color,
	CylinderGeometry,
	DirectionalLight,
	DoubleSide,
	Float32BufferAttribute,
	GridHelper,
	Group,
	Line,
	LineBasicMaterial,
	LineDashedMaterial,
	LineLoop,
	Mesh,
	MeshBasicMaterial,
	MeshLambertMaterial,
	Object3D,
	OctahedronGeometry,
	OrthographicCamera,
	Quaternion,
	Scene,
	SphereGeometry,
	Sprite,
	SpriteMaterial,
	SRGBColorSpace,
	Vector3,
	WebGLRenderer,
	type Material
} from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';

/** A vehicle-axes point in mm. */
export type Vec3 = [number, number, number];

/** One solved position of the linkage (the API sample shape solved with `points=true`). */
export interface Frame {
	/** sweep variable at this sample: heave travel (mm), roll (deg) or rack (mm) */
	position: number;
	/** solved point positions, mm, vehicle axes */
	points: Record<string, Vec3>;
	wheel_centre: Vec3;
	contact_patch: Vec3;
	/** front-view instant centre [y, z] on the plane x = wheel centre x, or null when the arm lines are parallel */
	fvic: [number, number] | null;
	/** roll-centre height at y = 0 (heave only), or null */
	rc_height: number | null;
}

import type { CornerKind } from '$lib/kinds';
export type { CornerKind };
export type ViewPreset = 'front' | 'side' | 'top' | 'iso';

/** Everything the scene draws; replaced as a whole when the corner or a revision changes. */
export interface SceneData {
	frames: Frame[];
	ghost: Frame[] | null;
	kind: CornerKind;
	/** mm, wheel centre to ground of the loaded tyre */
	loadedRadius: number;
}

/** The handle LinkageView drives. */
export interface LinkageScene {
	setData(data: SceneData): void;
	setPose(index: number, highlight: string | null): void;
	setView(view: ViewPreset): void;
	refreshTheme(): void;
	resize(width: number, height: number): void;
	dispose(): void;
}

/** True when this browser can give three a WebGL 2 context (three 0.180 needs WebGL 2). */
export function webglAvailable(): boolean {
	try {
		const probe = document.createElement('canvas');
		const gl = probe.getContext('webgl2');
		gl?.getExtension('WEBGL_lose_context')?.loseContext();
		return !!gl;
	} catch {
		return false;
	}
}

const TOKENS = ['surface', 'panel', 'sunken', 'ink', 'muted', 'line', 'accent', 'good', 'warn', 'bad'] as const;
type Palette = Record<(typeof TOKENS)[number], Color>;

/** The theme tokens (`--lw-*`, "r g b" triples) of the page as three colours. */
function readPalette(): Palette {
	const style = getComputedStyle(document.documentElement);
	const out = {} as Palette;
	for (const name of TOKENS) {
		const [r, g, b] = style.getPropertyValue(`--lw-${name}`).trim().split(/[\s,]+/).map(Number);
		out[name] = [r, g, b].every(Number.isFinite) ? new Color().setRGB(r / 255, g / 255, b / 255, SRGBColorSpace) : new Color(0x808080);
	}
	return out;
}

/** Vehicle point (mm) to three world, written into out. */
function toWorld(p: Vec3, out: Vector3): Vector3 {
	return out.set(p[1], p[2], p[0]);
}

const JOINT_RADIUS = 9; // mm
const PIVOT_RADIUS = 12; // mm
const HIGHLIGHT_SCALE = 2.2;
const LINK_RADIUS = 5; // mm
const STRUT_RADIUS = 13; // mm
const SPRING_COIL_RADIUS = 34; // mm
const SPRING_TURNS = 7;
const SPRING_SEGMENTS = 160;
const CIRCLE_SEGMENTS = 72;
const LABEL_PX = 13; // label text height in CSS pixels
const STATICS_MM = 50; // the ground grid follows the wheel centre when it moves further than this
const REFIT_MM = 200; // a wheel centre moved further than this is another corner: frame it afresh
const GIZMO_PX = 170; // CSS pixels: side of the axes-triad inset
const GIZMO_HALF = 2.1; // triad inset half-size in arrow lengths (room for the labels)

/** What the rig draws of a kind, read from its description (src/lib/kinds): the arms and rods, the upright's points. */
interface KindDrawing {
	/** arms (pivot to ball joint) and rods (inner to outer joint), pairs of point names */
	links: [string, string][];
	/** the strut: lower point to top mount */
	strut: [string, string] | null;
	/** the upright's two steering-axis points, or null (the upright is drawn as a star about the spin axis) */
	axis: [string, string] | null;
	/** the upright's points other than the wheel's */
	upright: string[];
	/** points fixed to the chassis or the rack (drawn as pivots) */
	chassis: Set<string>;
}

/** The drawing of `kind`. */
function drawingOf(kind: string): KindDrawing {
	const spec = kindSpec(kind);
	const links: [string, string][] = [];
	let strut: [string, string] | null = null;
	for (const j of spec.joints) {
		if (j.type === 'ball') {
			const pivot = spec.joints.find((q) => q.type === 'pivot' && q.body === j.body);
			if (pivot && pivot.type === 'pivot') links.push([pivot.axis[0], j.at], [pivot.axis[1], j.at]);
		} else if (j.type === 'rod') links.push([j.inner, j.outer]);
		else if (j.type === 'slider') strut = [j.lower, j.top];
		else if (j.type === 'rigid') {
			const pivot = spec.joints.find((q) => q.type === 'pivot' && q.body === j.body);
			if (pivot && pivot.type === 'pivot') links.push([pivot.axis[0], 'wheel.axis_inner'], [pivot.axis[1], 'wheel.axis_inner'], [pivot.axis[0], pivot.axis[1]]);
		}
	}
	const a = spec.steeringAxis;
	const axis: [string, string] | null = a.type === 'points' ? [a.lower, strut && a.upper === strut[1] ? strut[0] : a.upper] : null;
	const upright = spec.points.filter((p) => (p.body === 'upright' || p.body === 'arm') && !p.name.startsWith('wheel.')).map((p) => p.name);
	const chassis = new Set([...spec.points.filter((p) => p.body === 'chassis' || p.body === 'rack').map((p) => p.name), 'spring.chassis', 'rocker.pivot_a', 'rocker.pivot_b']);
	return { links, strut, axis, upright, chassis };
}

const scratchA = new Vector3();
const scratchB = new Vector3();
const scratchQ = new Quaternion();
const Y_AXIS = new Vector3(0, 1, 0);

/** Place a unit-height cylinder (axis along Y, centred) between a and b (world). */
function placeRod(rod: Object3D, a: Vector3, b: Vector3, radius: number) {
	const len = a.distanceTo(b);
	rod.visible = len > 1e-6;
	if (!rod.visible) return;
	rod.position.copy(a).add(b).multiplyScalar(0.5);
	scratchQ.setFromUnitVectors(Y_AXIS, scratchB.copy(b).sub(a).divideScalar(len));
	rod.quaternion.copy(scratchQ);
	rod.scale.set(radius, len, radius);
}

/** Text drawn once into a canvas texture, shown as a sprite of constant on-screen size. */
function makeLabel(text: string, color: Color, registry: Set<Sprite>): Sprite {
	const ratio = 2;
	const font = `600 ${LABEL_PX * ratio}px "Inter Variable", system-ui, sans-serif`;
	const canvas = document.createElement('canvas');
	const ctx = canvas.getContext('2d');
	let width = 8;
	if (ctx) {
		ctx.font = font;
		width = Math.ceil(ctx.measureText(text).width) + 8;
	}
	canvas.width = width;
	canvas.height = Math.ceil(LABEL_PX * ratio * 1.4);
	if (ctx) {
		ctx.font = font;
		ctx.textBaseline = 'middle';
		ctx.fillStyle = `#${color.getHexString(SRGBColorSpace)}`;
		ctx.fillText(text, 4, canvas.height / 2);
	}
	const texture = new CanvasTexture(canvas);
	texture.colorSpace = SRGBColorSpace;
	const sprite = new Sprite(new SpriteMaterial({ map: texture, depthTest: false, depthWrite: false, transparent: true }));
	sprite.center.set(0, 0.5); // anchored at the text's left edge
	sprite.renderOrder = 10;
	sprite.userData.aspect = canvas.width / canvas.height;
	registry.add(sprite);
	return sprite;
}

/** Free every geometry, material and texture under root (shared geometries excepted). */
function disposeTree(root: Object3D, keep: Set<BufferGeometry>) {
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

/** Styling of one revision: the current one solid in accent, a ghost translucent in muted. */
interface Look {
	link: Color;
	joint: Color;
	pivot: Color;
	marker: Color;
	opacity: number;
	ghost: boolean;
}

/** The drawn objects of one revision, re-posed per frame. */
class RevisionRig {
	readonly group = new Group();
	private joints = new Map<string, Mesh>();
	private rods: { mesh: Mesh; a: string | (() => Vector3 | null); b: string; radius: number }[] = [];
	private spring: Line | null = null;
	private tyre: Group;
	private fvicMarker: Mesh;
	private rcMarker: Mesh;
	private fvLine: Line;
	private rcLine: Line;
	private contact: Mesh;
	private labels: Sprite[] = [];
	private halo: Mesh;
	private world = new Map<string, Vector3>();
	private drawing: KindDrawing;

	constructor(
		kind: CornerKind,
		names: string[],
		radius: number,
		private look: Look,
		shared: SharedGeometry,
		sprites: Set<Sprite>,
		private highlightColor: Color
	) {
		const mat = (color: Color) =>
			new MeshLambertMaterial({ color, transparent: look.ghost, opacity: look.opacity, depthWrite: !look.ghost });
		const linkMat = mat(look.link);
		const d = (this.drawing = drawingOf(kind));
		for (const name of names) {
			const pivot = d.chassis.has(name);
			const m = new Mesh(shared.sphere, mat(pivot ? look.pivot : look.joint));
			m.userData.radius = pivot ? PIVOT_RADIUS : JOINT_RADIUS;
			m.userData.color = (pivot ? look.pivot : look.joint).clone();
			m.scale.setScalar(m.userData.radius);
			this.joints.set(name, m);
			this.group.add(m);
			this.world.set(name, new Vector3());
		}
		const rod = (a: string | (() => Vector3 | null), b: string, r = LINK_RADIUS) => {
			if (typeof a === 'string' && !this.world.has(a)) return;
			if (!this.world.has(b)) return;
			const mesh = new Mesh(shared.cylinder, linkMat);
			this.group.add(mesh);
			this.rods.push({ mesh, a, b, radius: r });
		};
		for (const [a, b] of d.links) rod(a, b, b.startsWith('steer.') ? LINK_RADIUS * 0.9 : LINK_RADIUS);
		if (d.axis) {
			// upright body: steering axis side, down to the spin axis, and the steering arm to the tie-rod joint
			const [low, top] = d.axis;
			rod(low, top);
			rod(low, 'wheel.axis_inner');
			rod(top, 'wheel.axis_inner');
			for (const name of d.upright) if (name !== low && name !== top) rod(() => this.footOnAxis(name), name);
		} else for (const name of d.upright) rod(name, 'wheel.axis_inner');
		rod('wheel.axis_inner', 'wheel.centre', LINK_RADIUS * 1.6);
		if (d.strut) rod(d.strut[0], d.strut[1], STRUT_RADIUS);
		// the rocker: its pivot axis, its two arms from the axis, and the rod to its outer joint
		rod('rocker.pivot_a', 'rocker.pivot_b', LINK_RADIUS * 1.2);
		rod(() => this.rockerHub(), 'rocker.rod_end', LINK_RADIUS * 1.4);
		rod(() => this.rockerHub(), 'rocker.spring_end', LINK_RADIUS * 1.4);
		rod('rocker.rod_end', 'rocker.spring_end', LINK_RADIUS);
		rod('rocker.rod_end', 'rocker.rod_outer', LINK_RADIUS * 0.9);
		if (this.world.has('spring.chassis') && (this.world.has('spring.body') || this.world.has('rocker.spring_end'))) {
			const g = new BufferGeometry();
			g.setAttribute('position', new Float32BufferAttribute(new Float32Array((SPRING_SEGMENTS + 1) * 3), 3));
			this.spring = new Line(g, new LineBasicMaterial({ color: look.link, transparent: look.ghost, opacity: look.opacity }));
			this.group.add(this.spring);
		}
		// a soft halo around the highlighted point, so it reads even where it sits on an accent-coloured arm
		this.halo = new Mesh(shared.sphere, new MeshBasicMaterial({ color: highlightColor, transparent: true, opacity: 0.22, depthWrite: false }));
		this.halo.scale.setScalar(PIVOT_RADIUS * 3.6);
		this.halo.renderOrder = 6;
		this.halo.visible = false;
		this.group.add(this.halo);
		this.tyre = this.makeTyre(radius);
		this.group.add(this.tyre);

		const markerMat = new MeshBasicMaterial({ color: look.marker, transparent: look.ghost, opacity: look.opacity });
		this.fvicMarker = new Mesh(shared.octahedron, markerMat);
		this.rcMarker = new Mesh(shared.octahedron, markerMat);
		this.fvicMarker.scale.setScalar(16);
		this.rcMarker.scale.setScalar(16);
		this.contact = new Mesh(shared.octahedron, markerMat);
		this.contact.scale.set(12, 4, 12);
		const dashed = () =>
			new Line(
				new BufferGeometry().setFromPoints([new Vector3(), new Vector3()]),
				new LineDashedMaterial({ color: look.marker, dashSize: 24, gapSize: 14, transparent: look.ghost, opacity: look.opacity })
			);
		this.fvLine = dashed();
		this.rcLine = dashed();
		this.group.add(this.fvicMarker, this.rcMarker, this.contact, this.fvLine, this.rcLine);
		if (!look.ghost) {
			const fv = makeLabel('FVIC', look.marker, sprites);
			const rc = makeLabel('RC', look.marker, sprites);
			fv.userData.anchor = this.fvicMarker;
			rc.userData.anchor = this.rcMarker;
			this.labels.push(fv, rc);
			this.group.add(fv, rc);
		}
	}

	/** Tyre: translucent tread band, both sidewall edges, a rim circle and the spin axis, built about +Y and rotated per frame. */
	private makeTyre(radius: number): Group {
		const g = new Group();
		const width = Math.min(215, radius * 0.7);
		const band = new Mesh(
			new CylinderGeometry(radius, radius, width, CIRCLE_SEGMENTS, 1, true),
			new MeshBasicMaterial({ color: this.look.link, transparent: true, opacity: this.look.ghost ? 0.05 : 0.1, side: DoubleSide, depthWrite: false })
		);
		g.add(band);
		const lineMat = new LineBasicMaterial({ color: this.look.link, transparent: this.look.ghost, opacity: this.look.opacity });
		const circle = (r: number, y: number) => {
			const pts: Vector3[] = [];
			for (let i = 0; i < CIRCLE_SEGMENTS; i++) {
				const t = (i / CIRCLE_SEGMENTS) * Math.PI * 2;
				pts.push(new Vector3(r * Math.cos(t), y, r * Math.sin(t)));
			}
			return new LineLoop(new BufferGeometry().setFromPoints(pts), lineMat);
		};
		g.add(circle(radius, width / 2), circle(radius, -width / 2), circle(radius, 0), circle(radius * 0.62, width / 2 - 20));
		return g;
	}

	/** The rocker's hub: the middle of its pivot axis, world. */
	private rockerHub(): Vector3 | null {
		const a = this.world.get('rocker.pivot_a');
		const b = this.world.get('rocker.pivot_b');
		return a && b ? new Vector3().copy(a).add(b).multiplyScalar(0.5) : null;
	}

	/** Foot of the perpendicular from a point onto the upright's steering-side line (its lower to its upper axis point), world. */
	private footOnAxis(name: string): Vector3 | null {
		const p = this.world.get(name);
		const axis = this.drawing.axis;
		if (!axis) return null;
		const l = this.world.get(axis[0]);
		const u = this.world.get(axis[1]);
		if (!p || !l || !u) return null;
		const d = scratchA.copy(u).sub(l);
		const len2 = d.lengthSq();
		if (len2 < 1e-9) return null;
		const t = scratchB.copy(p).sub(l).dot(d) / len2;
		return new Vector3().copy(l).addScaledVector(d, t);
	}

	/** Move everything to frame f; highlight one point by name. */
	pose(f: Frame, highlight: string | null) {
		for (const [name, v] of this.world) {
			const p = f.points[name];
			if (p) toWorld(p, v);
		}
		for (const [name, m] of this.joints) {
			const present = !!f.points[name];
			m.visible = present;
			m.position.copy(this.world.get(name)!);
			const hot = name === highlight;
			m.scale.setScalar(m.userData.radius * (hot ? HIGHLIGHT_SCALE : 1));
			(m.material as MeshLambertMaterial).color.copy(hot ? this.highlightColor : m.userData.color);
			m.renderOrder = hot ? 5 : 0;
		}
		const hot = highlight ? this.joints.get(highlight) : undefined;
		this.halo.visible = !!hot?.visible && !this.look.ghost;
		if (hot) this.halo.position.copy(hot.position);
		for (const r of this.rods) {
			const a = typeof r.a === 'string' ? this.world.get(r.a)! : r.a();
			if (!a) {
				r.mesh.visible = false;
				continue;
			}
			placeRod(r.mesh, a.clone(), this.world.get(r.b)!.clone(), r.radius);
		}
		this.poseSpring();
		this.poseTyre();
		this.poseInstantCentres(f);
	}

	/** Spring as a coil from spring.chassis to spring.body. */
	private poseSpring() {
		if (!this.spring) return;
		const a = this.world.get('spring.chassis')!;
		const b = (this.world.get('rocker.spring_end') ?? this.world.get('spring.body'))!;
		const axis = new Vector3().copy(b).sub(a);
		const len = axis.length();
		if (len < 1e-6) return;
		axis.divideScalar(len);
		const u = new Vector3().crossVectors(axis, Math.abs(axis.y) < 0.9 ? Y_AXIS : new Vector3(1, 0, 0)).normalize();
		const w = new Vector3().crossVectors(axis, u);
		const attr = this.spring.geometry.getAttribute('position') as Float32BufferAttribute;
		for (let i = 0; i <= SPRING_SEGMENTS; i++) {
			const s = i / SPRING_SEGMENTS;
			const t = s * SPRING_TURNS * Math.PI * 2;
			const c = Math.cos(t) * SPRING_COIL_RADIUS;
			const d = Math.sin(t) * SPRING_COIL_RADIUS;
			attr.setXYZ(i, a.x + axis.x * len * s + u.x * c + w.x * d, a.y + axis.y * len * s + u.y * c + w.y * d, a.z + axis.z * len * s + u.z * c + w.z * d);
		}
		attr.needsUpdate = true;
		this.spring.geometry.computeBoundingSphere();
	}

	/** Tyre in the wheel plane: its cylinder axis along the spin axis (axis_inner to centre). */
	private poseTyre() {
		const c = this.world.get('wheel.centre');
		const i = this.world.get('wheel.axis_inner');
		if (!c || !i) {
			this.tyre.visible = false;
			return;
		}
		const axis = new Vector3().copy(c).sub(i);
		if (axis.lengthSq() < 1e-9) return;
		this.tyre.visible = true;
		this.tyre.position.copy(c);
		this.tyre.quaternion.setFromUnitVectors(Y_AXIS, axis.normalize());
	}

	/** Front-view instant centre, roll centre and the lines from the contact patch, on the plane x = wheel centre x. */
	private poseInstantCentres(f: Frame) {
		const x = f.wheel_centre[0];
		const cp = toWorld(f.contact_patch, new Vector3());
		this.contact.position.copy(cp);
		const fvic = f.fvic ? toWorld([x, f.fvic[0], f.fvic[1]], new Vector3()) : null;
		const rc = f.rc_height !== null ? toWorld([x, 0, f.rc_height], new Vector3()) : null;
		this.fvicMarker.visible = !!fvic;
		this.rcMarker.visible = !!rc;
		if (fvic) this.fvicMarker.position.copy(fvic);
		if (rc) this.rcMarker.position.copy(rc);
		setSegment(this.fvLine, cp, fvic);
		setSegment(this.rcLine, cp, rc);
		for (const l of this.labels) {
			const anchor = l.userData.anchor as Mesh;
			l.visible = anchor.visible;
			l.position.copy(anchor.position);
		}
	}

	dispose(keep: Set<BufferGeometry>, sprites: Set<Sprite>) {
		for (const l of this.labels) sprites.delete(l);
		disposeTree(this.group, keep);
	}
}

/** Point a two-point line at a → b, hidden when b is null. */
function setSegment(line: Line, a: Vector3, b: Vector3 | null) {
	line.visible = !!b;
	if (!b) return;
	const attr = line.geometry.getAttribute('position') as Float32BufferAttribute;
	attr.setXYZ(0, a.x, a.y, a.z);
	attr.setXYZ(1, b.x, b.y, b.z);
	attr.needsUpdate = true;
	line.geometry.computeBoundingSphere();
	line.computeLineDistances();
}

interface SharedGeometry {
	sphere: SphereGeometry;
	cylinder: CylinderGeometry;
	octahedron: OctahedronGeometry;
}

/** View directions (world, from the target towards the camera) of the presets. */
function viewDirection(view: ViewPreset, side: number): Vector3 {
	switch (view) {
		case 'front':
			return new Vector3(0, 0, 1); // from ahead of the car (vehicle +x), looking rearward
		case 'side':
			return new Vector3(side, 0, 0); // from the corner's own side
		case 'top':
			return new Vector3(0, 1, -1e-4).normalize(); // from above, forward at the top of the screen
		case 'iso':
			return new Vector3(-side * 0.8, 0.6, 1).normalize(); // from ahead, above and inboard: the linkage in front of the wheel
	}
}

/** Create the scene on canvas; throws when WebGL cannot start (the caller shows its fallback). */
export function createLinkageScene(canvas: HTMLCanvasElement): LinkageScene {
	const renderer = new WebGLRenderer({ canvas, antialias: true, preserveDrawingBuffer: true, alpha: false });
	renderer.setPixelRatio(Math.min(window.devicePixelRatio || 1, 2));
	renderer.outputColorSpace = SRGBColorSpace;
	renderer.autoClear = false; // draw() clears once, then overlays the axes triad

	const scene = new Scene();
	const camera = new OrthographicCamera(-1, 1, 1, -1, -100000, 100000);
	const controls = new OrbitControls(camera, canvas);
	controls.enableDamping = false; // damping needs a frame loop; we render only on change
	controls.zoomToCursor = true;
	controls.listenToKeyEvents(canvas); // arrow keys pan, Shift + arrows orbit, when the canvas has focus
	controls.keyPanSpeed = 20;
	controls.keyRotateSpeed = 10; // about 6° a press on a 500-px view

	const shared: SharedGeometry = {
		sphere: new SphereGeometry(1, 20, 14),
		cylinder: new CylinderGeometry(1, 1, 1, 12, 1),
		octahedron: new OctahedronGeometry(1)
	};
	const keep = new Set<BufferGeometry>([shared.sphere, shared.cylinder, shared.octahedron]);
	const sprites = new Set<Sprite>();

	const ambient = new AmbientLight(0xffffff, 1.6);
	const sun = new DirectionalLight(0xffffff, 1.6);
	sun.position.set(400, 1200, 900);
	scene.add(ambient, sun);

	let palette = readPalette();
	let data: SceneData | null = null;
	let pose = { index: 0, highlight: null as string | null };
	let statics = new Group();
	let current: RevisionRig | null = null;
	let ghost: RevisionRig | null = null;
	let fitted = false;
	let viewHalf = 500; // mm: half the visible height at zoom 1
	let width = 1;
	let height = 1;
	let side = 1;
	let pending = 0;

	/** Render once on the next animation frame (coalesces many changes into one draw). */
	function requestRender() {
		if (pending) return;
		pending = requestAnimationFrame(() => {
			pending = 0;
			draw();
		});
	}

	// The vehicle-axes triad lives in its own small scene, drawn in the lower-left corner with the main camera's
	// orientation: always visible, never in the way of the linkage or the roll centre.
	const gizmo = new Scene();
	const gizmoCamera = new OrthographicCamera(-GIZMO_HALF, GIZMO_HALF, GIZMO_HALF, -GIZMO_HALF, -10, 10);
	gizmo.add(new AmbientLight(0xffffff, 2.2));
	let gizmoLabels: { sprite: Sprite; tip: Vector3 }[] = [];
	const viewSpace = new Vector3();
	const inverse = new Quaternion();

	/** Labels at the arrow tips; an axis pointing at the viewer gets its label just below the origin instead. */
	function placeGizmoLabels() {
		inverse.copy(camera.quaternion).invert();
		for (const { sprite, tip } of gizmoLabels) {
			viewSpace.copy(tip).applyQuaternion(inverse);
			if (Math.hypot(viewSpace.x, viewSpace.y) > 0.35) sprite.position.copy(tip).multiplyScalar(1.32);
			else sprite.position.set(0, -0.42, 0).applyQuaternion(camera.quaternion);
		}
	}

	/** (Re)build the triad with the current palette: unit arrows along vehicle x, y and z. */
	function buildGizmo() {
		for (const child of [...gizmo.children]) {
			if (child instanceof AmbientLight) continue;
			gizmo.remove(child);
			disposeTree(child, keep);
		}
		const mat = new MeshBasicMaterial({ color: palette.ink });
		const o = new Vector3();
		const axes: [Vec3, string][] = [
			[[1, 0, 0], 'x forward'],
			[[0, 1, 0], 'y left'],
			[[0, 0, 1], 'z up']
		];
		const perPx = (2 * GIZMO_HALF) / GIZMO_PX;
		gizmoLabels = [];
		for (const [d, label] of axes) {
			const tip = toWorld(d, new Vector3());
			const shaft = new Mesh(shared.cylinder, mat);
			placeRod(shaft, o.clone(), tip.clone().multiplyScalar(0.82), 0.035);
			const head = new Mesh(new CylinderGeometry(0, 0.09, 0.22, 12), mat);
			head.position.copy(tip).multiplyScalar(0.89);
			head.quaternion.setFromUnitVectors(Y_AXIS, tip);
			const text = makeLabel(label, palette.ink, new Set());
			const h = LABEL_PX * 1.25 * perPx;
			text.center.set(0.5, 0.5);
			text.scale.set(h * text.userData.aspect, h, 1);
			gizmoLabels.push({ sprite: text, tip });
			gizmo.add(shaft, head, text);
		}
	}

	let draws = 0;

	function draw() {
		canvas.dataset.draws = String(++draws); // tests and the bench see when a new picture has been drawn
		// labels keep a constant on-screen size: world units per CSS pixel of the orthographic view
		const perPx = (camera.top - camera.bottom) / camera.zoom / height;
		for (const s of sprites) {
			const h = LABEL_PX * 1.4 * perPx;
			s.scale.set(h * s.userData.aspect, h, 1);
		}
		renderer.setScissorTest(false);
		renderer.setViewport(0, 0, width, height);
		renderer.clear();
		renderer.render(scene, camera);
		gizmoCamera.quaternion.copy(camera.quaternion);
		placeGizmoLabels();
		gizmoCamera.position.set(0, 0, 5).applyQuaternion(camera.quaternion);
		renderer.clearDepth();
		renderer.setScissorTest(true);
		renderer.setScissor(4, 4, GIZMO_PX, GIZMO_PX);
		renderer.setViewport(4, 4, GIZMO_PX, GIZMO_PX);
		renderer.render(gizmo, gizmoCamera);
		renderer.setScissorTest(false);
		renderer.setViewport(0, 0, width, height);
	}

	function applyFrustum() {
		const aspect = width / height;
		camera.left = -viewHalf * aspect;
		camera.right = viewHalf * aspect;
		camera.top = viewHalf;
		camera.bottom = -viewHalf;
		camera.updateProjectionMatrix();
	}

	/** Ground grid and centreline around the corner at frame 0. */
	function buildStatics(f: Frame) {
		scene.remove(statics);
		for (const s of statics.children) if (s instanceof Sprite) sprites.delete(s);
		disposeTree(statics, keep);
		statics = new Group();
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
		statics.add(clLabel);
		scene.add(statics);
	}

	/** What a rig's objects depend on: the kind, the tyre and the point names (not where the points are). */
	function shapeOf(frames: Frame[] | null | undefined, kind: CornerKind, radius: number): string {
		if (!frames || frames.length === 0) return '';
		const names = new Set<string>();
		for (const f of frames) for (const n in f.points) names.add(n);
		return `${kind}|${radius}|${[...names].sort().join(',')}`;
	}

	let currentShape = '';
	let ghostShape = '';
	let staticsCentre: Vec3 | null = null;

	/** Point names over all frames. */
	const namesOf = (fs: Frame[]) => [...new Set(fs.flatMap((f) => Object.keys(f.points)))];

	/**
	 * Bring the drawn objects in line with the data. A rig is rebuilt only when its shape changed (or `all`,
	 * after a theme change); a point edit only re-poses, so no material, shader or texture is made again.
	 */
	function rebuild(all = false) {
		if (all) {
			renderer.setClearColor(palette.sunken, 1);
			buildGizmo();
		}
		if (!data || data.frames.length === 0) {
			dropRig('current');
			dropRig('ghost');
			scene.remove(statics);
			staticsCentre = null;
			requestRender();
			return;
		}
		side = data.frames[0].wheel_centre[1] >= 0 ? 1 : -1;
		const wc = data.frames[0].wheel_centre;
		if (all || !staticsCentre || Math.hypot(wc[0] - staticsCentre[0], wc[1] - staticsCentre[1]) > STATICS_MM) {
			buildStatics(data.frames[0]);
			staticsCentre = [...wc];
		}
		const nextGhost = data.ghost && data.ghost.length > 0 ? shapeOf(data.ghost, data.kind, data.loadedRadius) : '';
		if (all || nextGhost !== ghostShape) {
			dropRig('ghost');
			if (nextGhost) {
				ghost = new RevisionRig(
					data.kind,
					namesOf(data.ghost!),
					data.loadedRadius,
					{ link: palette.muted, joint: palette.muted, pivot: palette.muted, marker: palette.muted, opacity: 0.4, ghost: true },
					shared,
					sprites,
					palette.accent
				);
				scene.add(ghost.group);
			}
			ghostShape = nextGhost;
		}
		const nextCurrent = shapeOf(data.frames, data.kind, data.loadedRadius);
		if (all || nextCurrent !== currentShape) {
			dropRig('current');
			current = new RevisionRig(
				data.kind,
				namesOf(data.frames),
				data.loadedRadius,
				{ link: palette.accent, joint: palette.ink, pivot: palette.ink, marker: palette.warn, opacity: 1, ghost: false },
				shared,
				sprites,
				palette.accent
			);
			scene.add(current.group);
			currentShape = nextCurrent;
		}
		applyPose();
		if (!fitted) {
			fit(data.frames);
			fitted = true;
		}
		requestRender();
	}

	/** Remove and free one rig. */
	function dropRig(which: 'current' | 'ghost') {
		const rig = which === 'current' ? current : ghost;
		if (!rig) return;
		rig.dispose(keep, sprites);
		scene.remove(rig.group);
		if (which === 'current') {
			current = null;
			currentShape = '';
		} else {
			ghost = null;
			ghostShape = '';
		}
	}

	function applyPose() {
		if (!data) return;
		const i = Math.max(0, Math.min(pose.index, data.frames.length - 1));
		const f = data.frames[i];
		if (f && current) current.pose(f, pose.highlight);
		if (data.ghost && ghost) {
			// the ghost follows by sweep position (nearest sample), so different grids still line up
			const g = nearest(data.ghost, f?.position ?? 0);
			if (g) ghost.pose(g, null);
		}
		requestRender();
	}

	/** Frame the linkage, the wheel and the roll centre in the 3-D preset. */
	function fit(frames: Frame[]) {
		const min = new Vector3(Infinity, Infinity, Infinity);
		const max = new Vector3(-Infinity, -Infinity, -Infinity);
		const add = (p: Vec3) => {
			toWorld(p, scratchA);
			min.min(scratchA);
			max.max(scratchA);
		};
		for (const f of [frames[0], frames[frames.length - 1]]) {
			for (const p of Object.values(f.points)) add(p);
			add(f.contact_patch);
			const r = data?.loadedRadius ?? 0;
			add([f.wheel_centre[0], f.wheel_centre[1], f.wheel_centre[2] + r]);
			add([f.wheel_centre[0] + r, f.wheel_centre[1], f.wheel_centre[2]]);
			add([f.wheel_centre[0] - r, f.wheel_centre[1], f.wheel_centre[2]]);
		}
		add([frames[0].wheel_centre[0], 0, 0]); // the centreline, where the roll centre sits
		const centre = min.clone().add(max).multiplyScalar(0.5);
		const radius = max.distanceTo(min) / 2;
		viewHalf = Math.max(200, radius * 0.95);
		controls.target.copy(centre);
		setView('iso');
	}

	function setView(view: ViewPreset) {
		const dir = viewDirection(view, side);
		camera.position.copy(controls.target).addScaledVector(dir, viewHalf * 6);
		camera.up.set(0, 1, 0);
		camera.zoom = 1;
		applyFrustum();
		camera.lookAt(controls.target);
		controls.update();
		requestRender();
	}

	controls.addEventListener('change', requestRender);
	// three restores its own GL state after a lost context; we only need to draw again
	canvas.addEventListener('webglcontextrestored', requestRender);

	return {
		setData(next) {
			// a point edit keeps the camera; another kind of corner, or another corner altogether, is framed afresh
			const before = data?.frames[0]?.wheel_centre;
			const after = next.frames[0]?.wheel_centre;
			const moved = !before || !after || Math.hypot(after[0] - before[0], after[1] - before[1], after[2] - before[2]) > REFIT_MM;
			if (data?.kind !== next.kind || moved) fitted = false;
			const first = data === null;
			data = next;
			rebuild(first);
		},
		setPose(index, highlight) {
			pose = { index, highlight };
			applyPose();
		},
		setView,
		refreshTheme() {
			palette = readPalette();
			rebuild(true);
		},
		resize(w, h) {
			width = Math.max(1, w);
			height = Math.max(1, h);
			renderer.setSize(width, height, false);
			applyFrustum();
			draw(); // synchronously, so a resized canvas is never shown blank
		},
		dispose() {
			if (pending) cancelAnimationFrame(pending);
			controls.removeEventListener('change', requestRender);
			controls.dispose();
			current?.dispose(keep, sprites);
			ghost?.dispose(keep, sprites);
			disposeTree(statics, keep);
			disposeTree(gizmo, keep);
			for (const g of keep) g.dispose();
			canvas.removeEventListener('webglcontextrestored', requestRender);
			renderer.dispose();
			renderer.forceContextLoss(); // browsers cap live contexts: free this one now, not at garbage collection
		}
	};
}

/** The frame whose sweep position is nearest to position. */
function nearest(frames: Frame[], position: number): Frame | null {
	let best: Frame | null = null;
	let gap = Infinity;
	for (const f of frames) {
		const d = Math.abs(f.position - position);
		if (d < gap) {
			gap = d;
			best = f;
		}
	}
	return best;
}
