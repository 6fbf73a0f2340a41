// Mesh parsers against files written here by the formats' published descriptions:
// STL: 3D Systems, "StereoLithography Interface Specification" (binary: 80-byte header, uint32 count, 50 bytes
// per triangle; ASCII: solid / facet normal / outer loop / vertex / endloop / endfacet / endsolid).
// PLY: G. Turk, "The PLY Polygon File Format" (header, element/property lines, ascii and binary bodies).
// OBJ: Wavefront Advanced Visualizer manual, appendix B1 "Object Files" (v, f, v/vt/vn, negative indices).
import { describe, expect, it } from 'vitest';
import { MeshParseError, parseMesh } from '../../../src/lib/mesh/parse';
import { decodePreview, guessUnit } from '../../../src/lib/mesh/preview';
import { simplifyForPreview } from '../../../src/lib/mesh/simplify';
import { asciiStl, binaryStl, boxTriangles, obj, ply, sphereTriangles } from '../../scan-files';

const box = boxTriangles([10, 20, 30], [110, 70, 90]);

function expectBox(m: ReturnType<typeof parseMesh>) {
	expect(m.triangleCount).toBe(12);
	expect(m.vertexCount).toBe(8);
	const xs = Array.from(m.positions).filter((_, i) => i % 3 === 0);
	expect(Math.min(...xs)).toBe(10);
	expect(Math.max(...xs)).toBe(110);
}

describe('STL', () => {
	it('reads a binary STL whose 80-byte header begins with "solid" as binary (size = 84 + 50 × count)', () => {
		const bytes = binaryStl(box, 'solid part but binary');
		const m = parseMesh('stl', bytes);
		expect(m.encoding).toBe('binary STL');
		expectBox(m);
	});
	it('reads it the same when fed in 7-byte chunks (streaming across records)', () => {
		const m = parseMesh('stl', binaryStl(box), 7);
		expectBox(m);
	});
	it('reads an ASCII STL, also in small chunks', () => {
		const m = parseMesh('stl', asciiStl(box), 5);
		expect(m.encoding).toBe('ASCII STL');
		expectBox(m);
	});
	it('refuses a truncated binary STL, naming the counts', () => {
		const bytes = binaryStl(box, 'binary part').subarray(0, 84 + 50 * 5 + 10);
		expect(() => parseMesh('stl', bytes)).toThrow(/header counts 12 triangles/);
	});
	it('refuses zero triangles', () => {
		expect(() => parseMesh('stl', binaryStl([], 'empty part'))).toThrow(/no triangles/);
		expect(() => parseMesh('stl', new TextEncoder().encode('solid x\nendsolid x\n'))).toThrow(/no triangles/);
	});
	it('refuses NaN vertices, naming the triangle', () => {
		const t = boxTriangles([0, 0, 0], [1, 1, 1]);
		t[3][1] = [NaN, 0, 0];
		expect(() => parseMesh('stl', binaryStl(t, 'nan part'))).toThrow(/triangle 4: a coordinate is not a finite number/);
		expect(() => parseMesh('stl', asciiStl(t))).toThrow(/line \d+: a coordinate is not a finite number/);
	});
	it('refuses what is not an STL', () => {
		expect(() => parseMesh('stl', new TextEncoder().encode('name,x,y,z\nupper.front,1,2,3\n'))).toThrow(MeshParseError);
		expect(() => parseMesh('stl', new Uint8Array(0))).toThrow(/empty/);
	});
});

describe('PLY', () => {
	for (const format of ['ascii', 'binary_little_endian', 'binary_big_endian'] as const) {
		it(`reads ${format} with an extra vertex property, in 3-byte chunks`, () => {
			const m = parseMesh('ply', ply(box, format), 3);
			expectBox(m);
		});
	}
	it('refuses a point cloud (no faces) and a truncated body', () => {
		const cloud = new TextEncoder().encode('ply\nformat ascii 1.0\nelement vertex 1\nproperty float x\nproperty float y\nproperty float z\nend_header\n1 2 3\n');
		expect(() => parseMesh('ply', cloud)).toThrow(/point cloud is not a mesh/);
		const whole = ply(box, 'binary_little_endian');
		expect(() => parseMesh('ply', whole.subarray(0, whole.length - 20))).toThrow(/truncated PLY: \d+ of 12 "face"/);
	});
	it('refuses a face index outside the vertices', () => {
		const bad = new TextEncoder().encode(
			'ply\nformat ascii 1.0\nelement vertex 3\nproperty float x\nproperty float y\nproperty float z\nelement face 1\nproperty list uchar int vertex_indices\nend_header\n0 0 0\n1 0 0\n0 1 0\n3 0 1 5\n'
		);
		expect(() => parseMesh('ply', bad)).toThrow(/vertex index 5 is outside 0…2/);
	});
});

describe('OBJ', () => {
	it('reads v and f lines with v/vt references', () => expectBox(parseMesh('obj', obj(box))));
	it('reads negative (relative) indices', () => expectBox(parseMesh('obj', obj(box, true), 11)));
	it('splits a quad into two triangles', () => {
		const m = parseMesh('obj', new TextEncoder().encode('v 0 0 0\nv 1 0 0\nv 1 1 0\nv 0 1 0\nf 1 2 3 4\n'));
		expect(m.triangleCount).toBe(2);
		expect(Array.from(m.indices)).toEqual([0, 1, 2, 0, 2, 3]);
	});
	it('refuses a face referring to a vertex not yet defined, and a non-OBJ file', () => {
		expect(() => parseMesh('obj', new TextEncoder().encode('v 0 0 0\nf 1 2 3\n'))).toThrow(/vertex 2 is not defined/);
		expect(() => parseMesh('obj', new TextEncoder().encode('%PDF-1.4\n'))).toThrow(/not an OBJ statement/);
	});
});

describe('preview and unit guess', () => {
	it('simplifies a fine sphere under the target and keeps the original vertices', async () => {
		const tris = sphereTriangles([0, 0, 0], 50, 120, 160);
		const m = parseMesh('stl', binaryStl(tris));
		const { stats, preview } = await simplifyForPreview(m, 2000);
		expect(stats.triangles).toBe(tris.length);
		expect(stats.previewTriangles).toBeLessThanOrEqual(2100);
		const back = decodePreview(preview.buffer.slice(preview.byteOffset, preview.byteOffset + preview.byteLength) as ArrayBuffer);
		expect(back.indices.length / 3).toBe(stats.previewTriangles);
		// every preview vertex lies on the sphere (the simplifier keeps original positions); float32 rounding only
		for (let i = 0; i < back.positions.length; i += 3)
			expect(Math.abs(Math.hypot(back.positions[i], back.positions[i + 1], back.positions[i + 2]) - 50)).toBeLessThan(1e-4);
	});
	it('guesses m, inches and mm from the largest extent (common practice, no source)', () => {
		expect(guessUnit({ min: [0, 0, 0], max: [0.6, 0.4, 0.5] })).toBe('m');
		expect(guessUnit({ min: [0, 0, 0], max: [24, 16, 20] })).toBe('in');
		expect(guessUnit({ min: [0, 0, 0], max: [600, 400, 500] })).toBe('mm');
	});
});
