// Text in the 3-D view: a label drawn once into a canvas texture, shown as a sprite of constant on-screen size.
import { CanvasTexture, SRGBColorSpace, Sprite, SpriteMaterial, type Color } from 'three';

/** Label text height in CSS pixels. */
export const LABEL_PX = 13;

/** Text drawn once into a canvas texture, shown as a sprite of constant on-screen size. */
export function makeLabel(text: string, color: Color, registry: Set<Sprite>): Sprite {
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
	sprite.userData.text = text;
	registry.add(sprite);
	return sprite;
}

/** Keep every label of `sprites` at its on-screen size: `perPx` world units per CSS pixel. */
export function sizeLabels(sprites: Iterable<Sprite>, perPx: number): void {
	for (const s of sprites) {
		const h = LABEL_PX * 1.4 * perPx;
		s.scale.set(h * s.userData.aspect, h, 1);
	}
}

/** A label's box on screen in CSS pixels: top-left corner, width and height (y grows downwards). */
export interface LabelBox {
	x: number;
	y: number;
	w: number;
	h: number;
}

/** Do two boxes overlap (touching edges, closer than `gap`, count as overlapping)? */
export function overlaps(a: LabelBox, b: LabelBox, gap = 0): boolean {
	return a.x < b.x + b.w + gap && b.x < a.x + a.w + gap && a.y < b.y + b.h + gap && b.y < a.y + a.h + gap;
}

/**
 * Screen-space de-overlap: places the boxes one after another in the order given (the first never moves), each
 * at the nearest of a set of offsets (up or down by half a label height at a time, and a label's width or two to
 * either side) where it clears every box placed before it by `gap` px; if none clears, the offset with the least
 * overlapping area. `fixed` boxes (the axes triad's inset) are kept clear of and never move; with `bounds` (the
 * view's size) a place partly outside the view counts its outside part as overlap. Returns each box's
 * offset in CSS pixels. Pure: the 3-D view calls it on every draw.
 */
export function spreadLabels(boxes: LabelBox[], gap = 2, fixed: LabelBox[] = [], bounds?: { w: number; h: number }): { dx: number; dy: number }[] {
	const placed: LabelBox[] = [...fixed];
	const out: { dx: number; dy: number }[] = [];
	for (const b of boxes) {
		// nearby places, nearest first (up or down by half a label height at a time, a label's width to either side)
		const candidates: [number, number][] = [];
		for (let k = -16; k <= 16; k++) for (const c of [0, 1, -1, 2, -2]) candidates.push([c * (b.w + gap), (k * b.h) / 2]);
		candidates.sort((p, q) => Math.hypot(p[0], p[1]) - Math.hypot(q[0], q[1]) || Math.abs(p[0]) - Math.abs(q[0]));
		let best: [number, number] = [0, 0];
		let bestArea = Infinity;
		for (const [dx, dy] of candidates) {
			const moved = { ...b, x: b.x + dx, y: b.y + dy };
			let area = 0;
			if (bounds) {
				const inside = Math.max(0, Math.min(moved.x + moved.w, bounds.w) - Math.max(moved.x, 0)) * Math.max(0, Math.min(moved.y + moved.h, bounds.h) - Math.max(moved.y, 0));
				// (less than a hundredth of a pixel is rounding, not overlap)
				area += Math.max(0, moved.w * moved.h - inside - 0.01);
			}
			for (const p of placed) {
				if (!overlaps(moved, p, gap)) continue;
				const w = Math.min(moved.x + moved.w, p.x + p.w) - Math.max(moved.x, p.x) + gap;
				const h = Math.min(moved.y + moved.h, p.y + p.h) - Math.max(moved.y, p.y) + gap;
				area += Math.max(0, w) * Math.max(0, h);
			}
			if (area < bestArea) {
				best = [dx, dy];
				bestArea = area;
				if (area === 0) break;
			}
		}
		placed.push({ ...b, x: b.x + best[0], y: b.y + best[1] });
		out.push({ dx: best[0], dy: best[1] });
	}
	return out;
}
