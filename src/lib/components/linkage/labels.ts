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
