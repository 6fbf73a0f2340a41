// The scan's figures and its simplified preview (meshoptimizer's simplifier, WebAssembly). Used by the scan worker.
import { MeshoptSimplifier } from 'meshoptimizer/simplifier';
import type { ParsedMesh } from './parse';
import { boundsOf, encodePreview, guessUnit, type Bounds, type LengthUnit } from './preview';

/** Triangles kept in a preview at most: about 3.6 MB at 12 bytes a vertex and a triangle (budget 5 MB). */
export const PREVIEW_TRIANGLES = 200_000;

export interface ScanStats {
	encoding: string;
	vertices: number;
	triangles: number;
	bounds: Bounds;
	unitGuess: LengthUnit;
	previewTriangles: number;
	previewVertices: number;
	/** the simplifier's error, relative to the mesh's size (meshoptimizer's measure) */
	previewError: number;
}

/** Drops degenerate triangles (two equal corners) that welding left behind. */
function dropDegenerate(indices: Uint32Array): Uint32Array {
	let n = 0;
	const out = new Uint32Array(indices.length);
	for (let i = 0; i < indices.length; i += 3) {
		const a = indices[i], b = indices[i + 1], c = indices[i + 2];
		if (a === b || b === c || a === c) continue;
		out[n++] = a;
		out[n++] = b;
		out[n++] = c;
	}
	return out.subarray(0, n);
}

/** Figures and the preview's bytes of a parsed mesh. */
export async function simplifyForPreview(mesh: ParsedMesh, target = PREVIEW_TRIANGLES): Promise<{ stats: ScanStats; preview: Uint8Array }> {
	const bounds = boundsOf(mesh.positions);
	let indices = dropDegenerate(mesh.indices);
	let error = 0;
	if (indices.length / 3 > target) {
		await MeshoptSimplifier.ready;
		// positions kept as they are; 'Sparse' is not used, the whole mesh is simplified
		const [simple, err] = MeshoptSimplifier.simplify(indices, mesh.positions, 3, target * 3, 0.01, ['LockBorder']);
		indices = simple;
		error = err;
		if (indices.length / 3 > target * 1.05) {
			const [sloppy, err2] = MeshoptSimplifier.simplifySloppy(indices, mesh.positions, 3, null, target * 3, 0.05);
			indices = sloppy;
			error = Math.max(error, err2);
		}
	}
	// keep only the vertices the preview's triangles use
	const remap = new Int32Array(mesh.vertexCount).fill(-1);
	let count = 0;
	for (let i = 0; i < indices.length; i++) if (remap[indices[i]] < 0) remap[indices[i]] = count++;
	const positions = new Float32Array(3 * count);
	for (let v = 0; v < mesh.vertexCount; v++) {
		const r = remap[v];
		if (r >= 0) {
			positions[3 * r] = mesh.positions[3 * v];
			positions[3 * r + 1] = mesh.positions[3 * v + 1];
			positions[3 * r + 2] = mesh.positions[3 * v + 2];
		}
	}
	const out = new Uint32Array(indices.length);
	for (let i = 0; i < indices.length; i++) out[i] = remap[indices[i]];
	const preview = encodePreview({ positions, indices: out, bounds });
	return {
		stats: {
			encoding: mesh.encoding,
			vertices: mesh.vertexCount,
			triangles: mesh.triangleCount,
			bounds,
			unitGuess: guessUnit(bounds),
			previewTriangles: out.length / 3,
			previewVertices: count,
			previewError: error
		},
		preview
	};
}
