// The scan preview's compact binary form (client-safe): what the scan view downloads instead of the original.
//   bytes 0–3   "LWPV"
//   4–7         uint32 version (1)
//   8–11        uint32 vertex count V
//   12–15       uint32 triangle count T
//   16–39       float32 × 6: bounds min x y z, max x y z (file units)
//   40…         float32 × 3V positions (file units, the original vertices kept by the simplifier), then
//               uint32 × 3T indices
// All little-endian. Float32 positions rather than quantised ones: the fits read these points, and a 16-bit grid
// over a 2 m scan would add 0.03 mm steps.

export const PREVIEW_MAGIC = 'LWPV';
export const PREVIEW_HEADER_BYTES = 40;

export interface Bounds {
	min: [number, number, number];
	max: [number, number, number];
}

export interface PreviewMesh {
	positions: Float32Array;
	indices: Uint32Array;
	bounds: Bounds;
}

/** The bounds of xyz positions. */
export function boundsOf(positions: Float32Array): Bounds {
	const min: [number, number, number] = [Infinity, Infinity, Infinity];
	const max: [number, number, number] = [-Infinity, -Infinity, -Infinity];
	for (let i = 0; i < positions.length; i += 3) {
		for (let k = 0; k < 3; k++) {
			const v = positions[i + k];
			if (v < min[k]) min[k] = v;
			if (v > max[k]) max[k] = v;
		}
	}
	return { min, max };
}

/** Encodes a preview mesh. */
export function encodePreview(mesh: PreviewMesh): Uint8Array {
	const V = mesh.positions.length / 3;
	const T = mesh.indices.length / 3;
	const out = new Uint8Array(PREVIEW_HEADER_BYTES + 12 * V + 12 * T);
	const view = new DataView(out.buffer);
	for (let i = 0; i < 4; i++) out[i] = PREVIEW_MAGIC.charCodeAt(i);
	view.setUint32(4, 1, true);
	view.setUint32(8, V, true);
	view.setUint32(12, T, true);
	[...mesh.bounds.min, ...mesh.bounds.max].forEach((v, i) => view.setFloat32(16 + 4 * i, v, true));
	new Float32Array(out.buffer, PREVIEW_HEADER_BYTES, 3 * V).set(mesh.positions);
	new Uint32Array(out.buffer, PREVIEW_HEADER_BYTES + 12 * V, 3 * T).set(mesh.indices);
	return out;
}

/** Decodes a preview; throws on anything that is not one. */
export function decodePreview(bytes: ArrayBuffer): PreviewMesh {
	const view = new DataView(bytes);
	const magic = String.fromCharCode(...new Uint8Array(bytes, 0, Math.min(4, bytes.byteLength)));
	if (magic !== PREVIEW_MAGIC || view.getUint32(4, true) !== 1) throw new Error('not a scan preview (version 1)');
	const V = view.getUint32(8, true);
	const T = view.getUint32(12, true);
	if (bytes.byteLength !== PREVIEW_HEADER_BYTES + 12 * V + 12 * T) throw new Error('scan preview: wrong length');
	const b = Array.from({ length: 6 }, (_, i) => view.getFloat32(16 + 4 * i, true));
	return {
		positions: new Float32Array(bytes.slice(PREVIEW_HEADER_BYTES, PREVIEW_HEADER_BYTES + 12 * V)),
		indices: new Uint32Array(bytes.slice(PREVIEW_HEADER_BYTES + 12 * V)),
		bounds: { min: [b[0], b[1], b[2]], max: [b[3], b[4], b[5]] }
	};
}

export type LengthUnit = 'mm' | 'm' | 'in';
export const UNIT_MM: Record<LengthUnit, number> = { mm: 1, m: 1000, in: 25.4 };

/**
 * The unit a scan of a car's corner was most likely saved in, from its largest extent in file units. A corner's
 * scan spans about 0.2 to 3 m: up to 10 it is metres, up to 200 inches (8 in … 200 in), beyond millimetres.
 * Thresholds are common practice (no source); the engineer can change the unit on the page.
 */
export function guessUnit(bounds: Bounds): LengthUnit {
	const extent = Math.max(bounds.max[0] - bounds.min[0], bounds.max[1] - bounds.min[1], bounds.max[2] - bounds.min[2]);
	if (extent <= 10) return 'm';
	if (extent <= 200) return 'in';
	return 'mm';
}
