// One revision drawn in the 3-D view: its arms, rods, joints, spring, tyre and instant-centre markers, built once
// from the kind's description (src/lib/kinds) and re-posed per solved frame.
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, millimetres, z = 0 the ground.
// three.js is y-up, so every vehicle point (x, y, z) is drawn at three (X, Y, Z) = (y, z, x): a cyclic permutation,
// hence still right-handed, with vehicle z up on screen. One three unit is one millimetre.
import { kindMembers, kindSpec } from '$lib/kinds';
import { BufferGeometry, CylinderGeometry, DoubleSide, Float32BufferAttribute, Group, Line, LineBasicMaterial, LineDashedMaterial, LineLoop, Mesh, MeshBasicMaterial, MeshLambertMaterial, Vector3, type Color, type Sprite } from 'three';
import { disposeTree, placeRod, scratchA, scratchB, setSegment, toWorld, Y_AXIS, type SharedGeometry } from './basics';
import { makeLabel } from './labels';
import type { CornerKind, Frame } from './types';

const JOINT_RADIUS = 9; // mm
const PIVOT_RADIUS = 12; // mm
const HIGHLIGHT_SCALE = 2.2;
const LINK_RADIUS = 5; // mm
const STRUT_RADIUS = 13; // mm
const SPRING_COIL_RADIUS = 34; // mm
const SPRING_TURNS = 7;
const SPRING_SEGMENTS = 160;
const CIRCLE_SEGMENTS = 72;

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
	const { links, strut } = kindMembers(kind);
	const a = spec.steeringAxis;
	const axis: [string, string] | null = a.type === 'points' ? [a.lower, strut && a.upper === strut[1] ? strut[0] : a.upper] : null;
	const upright = spec.points.filter((p) => (p.body === 'upright' || p.body === 'arm') && !p.name.startsWith('wheel.')).map((p) => p.name);
	const chassis = new Set([...spec.points.filter((p) => p.body === 'chassis' || p.body === 'rack').map((p) => p.name), 'spring.chassis', 'rocker.pivot_a', 'rocker.pivot_b']);
	return { links, strut, axis, upright, chassis };
}

/** Styling of one revision: the current one solid in accent, a ghost translucent in muted. */
export interface Look {
	link: Color;
	joint: Color;
	pivot: Color;
	marker: Color;
	opacity: number;
	ghost: boolean;
}

/** The drawn objects of one revision, re-posed per frame. */
export class RevisionRig {
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
			rc.userData.priority = 1; // the roll centre's label stays at its marker; the instant centre's gives way
			fv.userData.priority = 2;
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
