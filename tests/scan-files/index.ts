// Synthetic scan files made in the tests (no real scans): tessellated spheres, boxes and discs written as STL
// (binary and ASCII), PLY (ASCII, binary little- and big-endian) and OBJ, following each format's published
// description (see src/lib/mesh/parse.ts for the references). Used by unit, integration, e2e tests and the bench.

export type Tri = [number[], number[], number[]];

/** A UV sphere of radius r about c as triangles (nLat × nLon quads, poles as fans). */
export function sphereTriangles(c: number[], r: number, nLat = 16, nLon = 24): Tri[] {
	const p = (i: number, j: number) => {
		const th = (Math.PI * i) / nLat;
		const ph = (2 * Math.PI * j) / nLon;
		return [c[0] + r * Math.sin(th) * Math.cos(ph), c[1] + r * Math.sin(th) * Math.sin(ph), c[2] + r * Math.cos(th)];
	};
	const out: Tri[] = [];
	for (let i = 0; i < nLat; i++)
		for (let j = 0; j < nLon; j++) {
			const a = p(i, j), b = p(i + 1, j), cc = p(i + 1, j + 1), d = p(i, j + 1);
			if (i > 0) out.push([a, b, d]);
			if (i < nLat - 1) out.push([b, cc, d]);
		}
	return out;
}

/** An axis-aligned box from lo to hi as 12 triangles. */
export function boxTriangles(lo: number[], hi: number[]): Tri[] {
	const v = (x: number, y: number, z: number) => [x ? hi[0] : lo[0], y ? hi[1] : lo[1], z ? hi[2] : lo[2]];
	const quads = [
		[v(0, 0, 0), v(0, 1, 0), v(1, 1, 0), v(1, 0, 0)],
		[v(0, 0, 1), v(1, 0, 1), v(1, 1, 1), v(0, 1, 1)],
		[v(0, 0, 0), v(1, 0, 0), v(1, 0, 1), v(0, 0, 1)],
		[v(0, 1, 0), v(0, 1, 1), v(1, 1, 1), v(1, 1, 0)],
		[v(0, 0, 0), v(0, 0, 1), v(0, 1, 1), v(0, 1, 0)],
		[v(1, 0, 0), v(1, 1, 0), v(1, 1, 1), v(1, 0, 1)]
	];
	return quads.flatMap((q) => [[q[0], q[1], q[2]] as Tri, [q[0], q[2], q[3]] as Tri]);
}

/** Binary STL: 80-byte header (here beginning with "solid", which the format allows), uint32 count, 50 bytes each. */
export function binaryStl(tris: Tri[], header = 'solid synthetic part written as binary'): Uint8Array {
	const out = new Uint8Array(84 + 50 * tris.length);
	const view = new DataView(out.buffer);
	for (let i = 0; i < Math.min(80, header.length); i++) out[i] = header.charCodeAt(i);
	view.setUint32(80, tris.length, true);
	tris.forEach((t, n) => {
		const at = 84 + 50 * n;
		t.forEach((p, k) => p.forEach((x, a) => view.setFloat32(at + 12 + 12 * k + 4 * a, x, true)));
	});
	return out;
}

/** ASCII STL. */
export function asciiStl(tris: Tri[], name = 'synthetic'): Uint8Array {
	const lines = [`solid ${name}`];
	for (const t of tris) {
		lines.push('  facet normal 0 0 0', '    outer loop');
		for (const p of t) lines.push(`      vertex ${p[0]} ${p[1]} ${p[2]}`);
		lines.push('    endloop', '  endfacet');
	}
	lines.push(`endsolid ${name}`);
	return new TextEncoder().encode(lines.join('\n') + '\n');
}

/** Indexed form of triangles (shared corners merged). */
export function indexed(tris: Tri[]) {
	const map = new Map<string, number>();
	const verts: number[][] = [];
	const faces: number[][] = [];
	for (const t of tris)
		faces.push(
			t.map((p) => {
				const key = p.join(',');
				if (!map.has(key)) {
					map.set(key, verts.length);
					verts.push(p);
				}
				return map.get(key)!;
			})
		);
	return { verts, faces };
}

/** PLY (ascii, binary_little_endian or binary_big_endian); vertex x y z float, face list uchar int. */
export function ply(tris: Tri[], format: 'ascii' | 'binary_little_endian' | 'binary_big_endian' = 'ascii'): Uint8Array {
	const { verts, faces } = indexed(tris);
	const header = `ply\nformat ${format} 1.0\ncomment synthetic\nelement vertex ${verts.length}\nproperty float x\nproperty float y\nproperty float z\nproperty uchar red\nelement face ${faces.length}\nproperty list uchar int vertex_indices\nend_header\n`;
	const head = new TextEncoder().encode(header);
	if (format === 'ascii') {
		const body = verts.map((v) => `${v[0]} ${v[1]} ${v[2]} 7`).concat(faces.map((f) => `3 ${f.join(' ')}`)).join('\n') + '\n';
		const b = new TextEncoder().encode(body);
		const out = new Uint8Array(head.length + b.length);
		out.set(head);
		out.set(b, head.length);
		return out;
	}
	const little = format === 'binary_little_endian';
	const out = new Uint8Array(head.length + verts.length * 13 + faces.length * 13);
	out.set(head);
	const view = new DataView(out.buffer);
	let at = head.length;
	for (const v of verts) {
		for (const x of v) (view.setFloat32(at, x, little), (at += 4));
		view.setUint8(at++, 7);
	}
	for (const f of faces) {
		view.setUint8(at++, 3);
		for (const i of f) (view.setInt32(at, i, little), (at += 4));
	}
	return out;
}

/** OBJ with v and f lines (the faces refer back with negative indices when `relative`). */
export function obj(tris: Tri[], relative = false): Uint8Array {
	const { verts, faces } = indexed(tris);
	const lines = ['# synthetic', 'o part', ...verts.map((v) => `v ${v[0]} ${v[1]} ${v[2]}`)];
	for (const f of faces) lines.push('f ' + f.map((i) => (relative ? `${i - verts.length}` : `${i + 1}/${i + 1}`)).join(' '));
	return new TextEncoder().encode(lines.join('\n') + '\n');
}

/** A rotation about z by a, then about x by b (radians), row-major. */
export function rotation(a: number, b: number): number[][] {
	const [ca, sa, cb, sb] = [Math.cos(a), Math.sin(a), Math.cos(b), Math.sin(b)];
	const Rz = [[ca, -sa, 0], [sa, ca, 0], [0, 0, 1]];
	const Rx = [[1, 0, 0], [0, cb, -sb], [0, sb, cb]];
	return Rx.map((row) => [0, 1, 2].map((j) => row[0] * Rz[0][j] + row[1] * Rz[1][j] + row[2] * Rz[2][j]));
}

/**
 * A corner's scan made here: tooling balls (radius 12 mm) on datum points and a ball joint (radius 15 mm) at
 * another point, in a scanner's own axes and in metres: file = R0ᵀ (p − t0) / 1000 for a vehicle point p (mm).
 * Aligning by the three datums must give back vehicle = R0 (1000 file) + t0.
 */
export const SCAN_FRAME = { R0: rotation(0.5, 0.17), t0: [1500, -200, 50] };

export function toScanFile(p: number[]): number[] {
	const { R0, t0 } = SCAN_FRAME;
	const d = [p[0] - t0[0], p[1] - t0[1], p[2] - t0[2]];
	return [0, 1, 2].map((j) => (R0[0][j] * d[0] + R0[1][j] * d[1] + R0[2][j] * d[2]) / 1000);
}

export function cornerScan(balls: { at: number[]; radius: number }[], detail = { lat: 16, lon: 24 }): Tri[] {
	return balls.flatMap((b) => sphereTriangles(b.at, b.radius, detail.lat, detail.lon).map((t) => t.map(toScanFile) as Tri));
}
