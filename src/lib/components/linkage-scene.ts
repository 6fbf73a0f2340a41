// The three.js scene behind LinkageView: loaded lazily (dynamic import) so pages without the view do not pay for three.
// This file sets the scene up (renderer, camera, controls, lights, framing, presets) and keeps the two rigs in line
// with the data; the parts live in ./linkage/: rig.ts (one revision's objects), labels.ts, gizmo.ts (axes triad),
// ground.ts (grid and centreline), basics.ts (palette, vehicle to three axes, rods), types.ts (data and handle).
//
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, millimetres, z = 0 the ground.
// three.js is y-up, so every vehicle point (x, y, z) is drawn at three (X, Y, Z) = (y, z, x): a cyclic permutation,
// hence still right-handed, with vehicle z up on screen. One three unit is one millimetre.
import { AmbientLight, CylinderGeometry, DirectionalLight, Group, OctahedronGeometry, OrthographicCamera, Scene, SphereGeometry, Sprite, SRGBColorSpace, Vector3, WebGLRenderer, type BufferGeometry } from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { disposeTree, readPalette, scratchA, toWorld, type SharedGeometry } from './linkage/basics';
import { AxesTriad, triadBox } from './linkage/gizmo';
import { buildGround } from './linkage/ground';
import { LABEL_PX, sizeLabels, spreadLabels } from './linkage/labels';
import { RevisionRig, type Look } from './linkage/rig';
import type { CornerKind, Frame, LinkageScene, SceneData, Vec3, ViewPreset } from './linkage/types';

export type { CornerKind, Frame, LinkageScene, SceneData, Vec3, ViewPreset } from './linkage/types';

const STATICS_MM = 50; // the ground grid follows the wheel centre when it moves further than this
const REFIT_MM = 200; // a wheel centre moved further than this is another corner: frame it afresh

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

	const triad = new AxesTriad(shared, keep);

	let draws = 0;

	function draw() {
		canvas.dataset.draws = String(++draws); // tests and the bench see when a new picture has been drawn
		// labels keep a constant on-screen size: world units per CSS pixel of the orthographic view
		const perPx = (camera.top - camera.bottom) / camera.zoom / height;
		sizeLabels(sprites, perPx);
		placeLabels(perPx);
		renderer.setScissorTest(false);
		renderer.setViewport(0, 0, width, height);
		renderer.clear();
		renderer.render(scene, camera);
		triad.render(renderer, camera);
		renderer.setScissorTest(false);
		renderer.setViewport(0, 0, width, height);
	}

	const right = new Vector3();
	const up = new Vector3();
	const onScreen = new Vector3();
	/** Is an object drawn (itself and every parent visible, and in the scene)? */
	const shown = (o: Sprite) => {
		for (let p: typeof o.parent | Sprite = o; p; p = p.parent) {
			if (!p.visible) return false;
			if (p === scene) return true;
		}
		return false;
	};
	/**
	 * Moves the labels apart on screen where they would overlap (front and side views bring the roll centre, the
	 * instant centre and the centreline together): each label's anchor is projected, `spreadLabels` picks the
	 * offsets in pixels, and they are applied along the camera's right and up directions.
	 */
	function placeLabels(perPx: number) {
		camera.updateMatrixWorld();
		right.setFromMatrixColumn(camera.matrixWorld, 0);
		up.setFromMatrixColumn(camera.matrixWorld, 1);
		const list = [...sprites].filter(shown).sort((a, b) => (a.userData.priority ?? 5) - (b.userData.priority ?? 5));
		const h = LABEL_PX * 1.4;
		const boxes = list.map((s) => {
			const base = (s.userData.anchor?.position as Vector3 | undefined) ?? (s.userData.base ??= s.position.clone());
			onScreen.copy(base).project(camera);
			const w = h * s.userData.aspect;
			const x = ((onScreen.x + 1) / 2) * width - s.center.x * w;
			const y = ((1 - onScreen.y) / 2) * height - (1 - s.center.y) * h;
			return { x, y, w, h };
		});
		const offsets = spreadLabels(boxes, 2, [triadBox(height)], { w: width, h: height });
		list.forEach((s, i) => {
			const base = (s.userData.anchor?.position as Vector3 | undefined) ?? (s.userData.base as Vector3);
			s.position.copy(base).addScaledVector(right, offsets[i].dx * perPx).addScaledVector(up, -offsets[i].dy * perPx);
		});
		// where the labels were drawn (CSS px in the canvas), for tests: [text, x, y, w, h]
		canvas.dataset.labels = JSON.stringify(list.map((s, i) => [s.userData.text, ...[boxes[i].x + offsets[i].dx, boxes[i].y + offsets[i].dy, boxes[i].w, boxes[i].h].map((v) => Math.round(v))]));
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
		statics = buildGround(f, palette, sprites);
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
			triad.build(palette.ink);
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
				ghost = addRig(data.ghost!, { link: palette.muted, joint: palette.muted, pivot: palette.muted, marker: palette.muted, opacity: 0.4, ghost: true });
			}
			ghostShape = nextGhost;
		}
		const nextCurrent = shapeOf(data.frames, data.kind, data.loadedRadius);
		if (all || nextCurrent !== currentShape) {
			dropRig('current');
			current = addRig(data.frames, { link: palette.accent, joint: palette.ink, pivot: palette.ink, marker: palette.warn, opacity: 1, ghost: false });
			currentShape = nextCurrent;
		}
		applyPose();
		if (!fitted) {
			fit(data.frames);
			fitted = true;
		}
		requestRender();
	}

	/** A new rig of the data's kind for `frames`, drawn with `look`, added to the scene. */
	function addRig(frames: Frame[], look: Look): RevisionRig {
		const rig = new RevisionRig(data!.kind, namesOf(frames), data!.loadedRadius, look, shared, sprites, palette.accent);
		scene.add(rig.group);
		return rig;
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
			triad.dispose();
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
