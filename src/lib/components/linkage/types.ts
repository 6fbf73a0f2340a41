// The 3-D view's data and handle: what LinkageView hands the scene and how it drives it (no three.js here).
// Frame: ISO 8855 vehicle axes, x forward, y left, z up, millimetres, z = 0 the ground.
// three.js is y-up, so every vehicle point (x, y, z) is drawn at three (X, Y, Z) = (y, z, x): a cyclic permutation,
// hence still right-handed, with vehicle z up on screen. One three unit is one millimetre.
import type { CornerKind } from '$lib/kinds';

export type { CornerKind };

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

/** A wheel as the car's 3-D view draws it: centre, a point inboard on its spin axis, loaded radius (mm). */
export interface SceneWheel {
	centre: Vec3;
	axis_inner: Vec3;
	radius: number;
}

/** An axle at one solved pose for the car's 3-D view: lines between its points, and its wheels (left, right). */
export interface SceneAxle {
	/** 'corners' (independent) or 'solid' */
	type: 'corners' | 'solid';
	/** in the trade's words, e.g. "double wishbone, both sides" or "solid axle, four links and a Panhard rod" */
	label: string;
	links: [Vec3, Vec3][];
	/** a solid axle's housing (drawn heavier); empty for independent corners */
	housing: [Vec3, Vec3][];
	wheels: [SceneWheel, SceneWheel];
}

/** The body as the car's 3-D view outlines it: a tub in plan view between two heights, the CG and the sprung items. */
export interface SceneBody {
	/** plan outline [x, y] (mm), closed */
	plan: [number, number][];
	floor: number;
	top: number;
	cg: Vec3;
	items: { name: string; mass: number; at: Vec3 }[];
}
