// Streaming mesh parsers (client-safe, no Node built-ins): STL (binary and ASCII), PLY (ASCII, binary little- and
// big-endian) and Wavefront OBJ, each fed chunk by chunk so a 500 MB file never sits in memory whole. Output: an
// indexed triangle mesh in the file's own units and axes. Polygons are split into triangle fans.
//
// The formats as published:
// - STL: 3D Systems, "StereoLithography Interface Specification" (1989/1988): binary = 80-byte header, uint32
//   triangle count, then 50 bytes per triangle (normal, three vertices as 12 little-endian float32, uint16
//   attribute byte count); ASCII = `solid name`, `facet normal …`, `outer loop`, three `vertex x y z`, `endloop`,
//   `endfacet`, `endsolid`. A binary file's header may itself begin with "solid": the file is binary when its size
//   is exactly 84 + 50 × count.
// - PLY: Greg Turk, "The PLY Polygon File Format" (1994): `ply`, `format ascii|binary_little_endian|
//   binary_big_endian 1.0`, `element`/`property`/`property list` lines, `end_header`, then the elements in order.
// - OBJ: Wavefront "Object Files (.obj)", Advanced Visualizer manual, appendix B1: `v x y z [w]`, `f v1 v2 v3 …`
//   with `v/vt/vn` references, 1-based, negative = relative to the end.
import { VertexWelder } from './weld';

export type MeshFormat = 'stl' | 'ply' | 'obj';

/** A parsed mesh: vertex positions (x, y, z per vertex, file units) and triangle indices. */
export interface ParsedMesh {
	positions: Float32Array;
	indices: Uint32Array;
	vertexCount: number;
	triangleCount: number;
	/** what was read, for the page: 'binary STL', 'ASCII PLY', … */
	encoding: string;
}

/** A file that is not a mesh of its format, with a message for the page. */
export class MeshParseError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'MeshParseError';
	}
}

export interface MeshParser {
	push(chunk: Uint8Array): void;
	end(): ParsedMesh;
}

/** A parser for a format; totalBytes is the file's size (needed to tell binary STL from ASCII). */
export function createParser(format: MeshFormat, totalBytes: number): MeshParser {
	if (format === 'stl') return new StlParser(totalBytes);
	if (format === 'ply') return new PlyParser();
	return new ObjParser();
}

/** Parses a whole file held in memory (tests, small files). */
export function parseMesh(format: MeshFormat, bytes: Uint8Array, chunkSize = 1 << 20): ParsedMesh {
	const p = createParser(format, bytes.length);
	for (let i = 0; i < bytes.length; i += chunkSize) p.push(bytes.subarray(i, Math.min(bytes.length, i + chunkSize)));
	return p.end();
}

/** Growable Uint32 list. */
class U32List {
	data = new Uint32Array(1024);
	length = 0;
	push(v: number) {
		if (this.length === this.data.length) {
			const next = new Uint32Array(this.data.length * 2);
			next.set(this.data);
			this.data = next;
		}
		this.data[this.length++] = v;
	}
	array() {
		return this.data.slice(0, this.length);
	}
}

/** Growable Float32 list of xyz triples. */
class F32List {
	data = new Float32Array(3 * 1024);
	length = 0;
	push3(x: number, y: number, z: number) {
		if (this.length + 3 > this.data.length) {
			const next = new Float32Array(this.data.length * 2);
			next.set(this.data);
			this.data = next;
		}
		this.data[this.length++] = x;
		this.data[this.length++] = y;
		this.data[this.length++] = z;
	}
	array() {
		return this.data.slice(0, this.length);
	}
}

function finite(x: number, y: number, z: number, where: () => string) {
	if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) throw new MeshParseError(`${where()}: a coordinate is not a finite number (NaN or infinity)`);
}

function finish(positions: Float32Array, indices: Uint32Array, encoding: string): ParsedMesh {
	const triangleCount = indices.length / 3;
	if (triangleCount === 0) throw new MeshParseError(`the file holds no triangles (${encoding})`);
	return { positions, indices, vertexCount: positions.length / 3, triangleCount, encoding };
}

/** Splits a byte stream into text lines (latin-1 is enough for the numbers and keywords of these formats). */
class LineSplitter {
	private rest = '';
	line = 0;
	constructor(private onLine: (line: string) => void) {}
	push(chunk: Uint8Array) {
		let text = this.rest;
		// String.fromCharCode over slices: fast and keeps bytes as latin-1
		for (let i = 0; i < chunk.length; i += 8192) text += String.fromCharCode.apply(null, chunk.subarray(i, i + 8192) as unknown as number[]);
		let start = 0;
		for (;;) {
			const nl = text.indexOf('\n', start);
			if (nl < 0) break;
			this.line++;
			this.onLine(text.slice(start, nl));
			start = nl + 1;
		}
		this.rest = text.slice(start);
		if (this.rest.length > 1 << 20) throw new MeshParseError(`line ${this.line + 1}: longer than 1 MB; not a text mesh file`);
	}
	end() {
		if (this.rest.length) {
			this.line++;
			this.onLine(this.rest);
			this.rest = '';
		}
	}
}

const WS = /\s+/;

// ---------------------------------------------------------------- STL

class StlParser implements MeshParser {
	private mode: 'unknown' | 'binary' | 'ascii' = 'unknown';
	private head = new Uint8Array(84);
	private headLen = 0;
	private expected = 0;
	private welder = new VertexWelder();
	private indices = new U32List();
	private record = new Uint8Array(50);
	private recordLen = 0;
	private triangles = 0;
	private ascii: LineSplitter | null = null;
	private facet: number[] = [];
	private sawSolid = false;

	constructor(private totalBytes: number) {}

	push(chunk: Uint8Array) {
		let c = chunk;
		if (this.mode === 'unknown') {
			const take = Math.min(84 - this.headLen, c.length);
			this.head.set(c.subarray(0, take), this.headLen);
			this.headLen += take;
			c = c.subarray(take);
			if (this.headLen < 84 && this.headLen < this.totalBytes) return;
			this.decide();
			if ((this.mode as string) === 'ascii') {
				this.ascii!.push(this.head.subarray(0, this.headLen));
			}
		}
		if (this.mode === 'ascii') this.ascii!.push(c);
		else this.pushBinary(c);
	}

	/** Binary when the size is exactly 84 + 50 × count (even when the header begins with "solid"), else ASCII. */
	private decide() {
		const text = String.fromCharCode(...this.head.subarray(0, Math.min(this.headLen, 80)));
		const startsSolid = /^\s*solid/.test(text);
		if (this.headLen >= 84) {
			const count = new DataView(this.head.buffer).getUint32(80, true);
			if (84 + 50 * count === this.totalBytes) {
				this.mode = 'binary';
				this.expected = count;
				return;
			}
			if (!startsSolid) {
				throw new MeshParseError(
					`not a complete binary STL: its header counts ${count} triangles (${84 + 50 * count} bytes) but the file has ${this.totalBytes} bytes (truncated or not an STL)`
				);
			}
		}
		if (!startsSolid) throw new MeshParseError(`not an STL: shorter than a binary STL header and not starting with "solid"`);
		this.mode = 'ascii';
		this.ascii = new LineSplitter((line) => this.asciiLine(line));
	}

	private pushBinary(c: Uint8Array) {
		let i = 0;
		if (this.recordLen > 0) {
			const take = Math.min(50 - this.recordLen, c.length);
			this.record.set(c.subarray(0, take), this.recordLen);
			this.recordLen += take;
			i = take;
			if (this.recordLen === 50) {
				this.binaryTriangle(new DataView(this.record.buffer), 0);
				this.recordLen = 0;
			}
		}
		const view = new DataView(c.buffer, c.byteOffset, c.byteLength);
		for (; i + 50 <= c.length; i += 50) this.binaryTriangle(view, i);
		if (i < c.length) {
			this.record.set(c.subarray(i), 0);
			this.recordLen = c.length - i;
		}
	}

	private binaryTriangle(view: DataView, at: number) {
		const n = this.triangles++;
		for (let v = 0; v < 3; v++) {
			const o = at + 12 + v * 12;
			const x = view.getFloat32(o, true);
			const y = view.getFloat32(o + 4, true);
			const z = view.getFloat32(o + 8, true);
			finite(x, y, z, () => `triangle ${n + 1}`);
			this.indices.push(this.welder.add(x, y, z));
		}
	}

	private asciiLine(raw: string) {
		const line = raw.trim();
		if (!line) return;
		const words = line.split(WS);
		const key = words[0].toLowerCase();
		if (key === 'vertex') {
			const x = Number(words[1]);
			const y = Number(words[2]);
			const z = Number(words[3]);
			if (words.length < 4) throw new MeshParseError(`line ${this.ascii!.line}: "vertex" needs three coordinates`);
			finite(x, y, z, () => `line ${this.ascii!.line}`);
			this.facet.push(this.welder.add(x, y, z));
		} else if (key === 'endloop') {
			if (this.facet.length < 3) throw new MeshParseError(`line ${this.ascii!.line}: a loop with ${this.facet.length} vertices (at least 3)`);
			for (let k = 1; k + 1 < this.facet.length; k++) {
				this.indices.push(this.facet[0]);
				this.indices.push(this.facet[k]);
				this.indices.push(this.facet[k + 1]);
			}
			this.facet = [];
		} else if (key === 'solid') this.sawSolid = true;
		else if (!['facet', 'outer', 'endfacet', 'endsolid'].includes(key)) {
			throw new MeshParseError(`line ${this.ascii!.line}: "${words[0].slice(0, 20)}" is not an ASCII STL keyword`);
		}
	}

	end(): ParsedMesh {
		if (this.mode === 'unknown') {
			if (this.headLen === 0) throw new MeshParseError('the file is empty');
			this.decide();
			if ((this.mode as string) === 'ascii') this.ascii!.push(this.head.subarray(0, this.headLen));
		}
		if (this.mode === 'binary') {
			if (this.triangles !== this.expected || this.recordLen !== 0)
				throw new MeshParseError(`truncated binary STL: ${this.triangles} of ${this.expected} triangles read`);
			return finish(this.welder.positions(), this.indices.array(), 'binary STL');
		}
		this.ascii!.end();
		if (!this.sawSolid) throw new MeshParseError('not an ASCII STL: no "solid" line');
		if (this.facet.length) throw new MeshParseError('truncated ASCII STL: the last facet has no "endloop"');
		return finish(this.welder.positions(), this.indices.array(), 'ASCII STL');
	}
}

// ---------------------------------------------------------------- PLY

type PlyType = 'int8' | 'uint8' | 'int16' | 'uint16' | 'int32' | 'uint32' | 'float32' | 'float64';
const PLY_TYPES: Record<string, PlyType> = {
	char: 'int8', int8: 'int8', uchar: 'uint8', uint8: 'uint8', short: 'int16', int16: 'int16', ushort: 'uint16',
	uint16: 'uint16', int: 'int32', int32: 'int32', uint: 'uint32', uint32: 'uint32', float: 'float32',
	float32: 'float32', double: 'float64', float64: 'float64'
};
const PLY_SIZE: Record<PlyType, number> = { int8: 1, uint8: 1, int16: 2, uint16: 2, int32: 4, uint32: 4, float32: 4, float64: 8 };

interface PlyProperty {
	name: string;
	type: PlyType;
	list?: PlyType;
}
interface PlyElement {
	name: string;
	count: number;
	props: PlyProperty[];
}

function readPly(view: DataView, at: number, type: PlyType, little: boolean): number {
	switch (type) {
		case 'int8': return view.getInt8(at);
		case 'uint8': return view.getUint8(at);
		case 'int16': return view.getInt16(at, little);
		case 'uint16': return view.getUint16(at, little);
		case 'int32': return view.getInt32(at, little);
		case 'uint32': return view.getUint32(at, little);
		case 'float32': return view.getFloat32(at, little);
		case 'float64': return view.getFloat64(at, little);
	}
}

class PlyParser implements MeshParser {
	private headerText = '';
	private inHeader = true;
	private format: 'ascii' | 'binary_little_endian' | 'binary_big_endian' = 'ascii';
	private elements: PlyElement[] = [];
	private el = 0;
	private done = 0;
	private positions = new F32List();
	private indices = new U32List();
	private vertexCount = 0;
	private buf = new Uint8Array(0);
	private lines: LineSplitter | null = null;

	push(chunk: Uint8Array) {
		let c = chunk;
		if (this.inHeader) {
			const text = String.fromCharCode.apply(null, c.subarray(0, Math.min(c.length, 65536)) as unknown as number[]);
			const all = this.headerText + text;
			const m = /end_header\r?\n/.exec(all);
			if (!m) {
				this.headerText = all;
				if (this.headerText.length > 65536) throw new MeshParseError('not a PLY file: no "end_header" within the first 64 kB');
				if (!/^ply\r?\n/.test(this.headerText) && this.headerText.length >= 4) throw new MeshParseError('not a PLY file: it does not start with "ply"');
				return;
			}
			const headerEnd = m.index + m[0].length;
			this.header(all.slice(0, headerEnd));
			c = c.subarray(headerEnd - this.headerText.length);
			this.inHeader = false;
			if (this.format === 'ascii') this.lines = new LineSplitter((l) => this.asciiLine(l));
		}
		if (this.lines) this.lines.push(c);
		else this.pushBinary(c);
	}

	private header(text: string) {
		const lines = text.split(/\r?\n/);
		if (lines[0] !== 'ply') throw new MeshParseError('not a PLY file: it does not start with "ply"');
		for (let i = 1; i < lines.length; i++) {
			const w = lines[i].trim().split(WS);
			if (w[0] === 'format') {
				if (!['ascii', 'binary_little_endian', 'binary_big_endian'].includes(w[1]))
					throw new MeshParseError(`PLY header line ${i + 1}: unknown format "${w[1]}"`);
				this.format = w[1] as PlyParser['format'];
			} else if (w[0] === 'element') {
				const count = Number(w[2]);
				if (!Number.isInteger(count) || count < 0) throw new MeshParseError(`PLY header line ${i + 1}: element count "${w[2]}" is not a whole number`);
				this.elements.push({ name: w[1], count, props: [] });
			} else if (w[0] === 'property') {
				const el = this.elements.at(-1);
				if (!el) throw new MeshParseError(`PLY header line ${i + 1}: a property before any element`);
				if (w[1] === 'list') {
					const list = PLY_TYPES[w[2]];
					const type = PLY_TYPES[w[3]];
					if (!list || !type) throw new MeshParseError(`PLY header line ${i + 1}: unknown list type "${w[2]} ${w[3]}"`);
					el.props.push({ name: w[4], type, list });
				} else {
					const type = PLY_TYPES[w[1]];
					if (!type) throw new MeshParseError(`PLY header line ${i + 1}: unknown property type "${w[1]}"`);
					el.props.push({ name: w[2], type });
				}
			}
		}
		const vertex = this.elements.find((e) => e.name === 'vertex');
		if (!vertex) throw new MeshParseError('PLY header: no "vertex" element');
		for (const axis of ['x', 'y', 'z'])
			if (!vertex.props.some((p) => p.name === axis && !p.list)) throw new MeshParseError(`PLY header: the vertex element has no "${axis}" property`);
		const face = this.elements.find((e) => e.name === 'face');
		if (!face || !face.props.some((p) => p.list && (p.name === 'vertex_indices' || p.name === 'vertex_index')))
			throw new MeshParseError('PLY header: no "face" element with a "vertex_indices" list (a point cloud is not a mesh)');
		this.vertexCount = vertex.count;
		this.skipEmpty();
	}

	private skipEmpty() {
		while (this.el < this.elements.length && this.done >= this.elements[this.el].count) {
			this.el++;
			this.done = 0;
		}
	}

	private vertex(values: (number | number[])[], props: PlyProperty[]) {
		let x = NaN, y = NaN, z = NaN;
		for (let k = 0; k < props.length; k++) {
			if (props[k].name === 'x') x = values[k] as number;
			else if (props[k].name === 'y') y = values[k] as number;
			else if (props[k].name === 'z') z = values[k] as number;
		}
		finite(x, y, z, () => `PLY vertex ${this.done + 1}`);
		this.positions.push3(x, y, z);
	}

	private face(values: (number | number[])[], props: PlyProperty[]) {
		const k = props.findIndex((p) => p.list && (p.name === 'vertex_indices' || p.name === 'vertex_index'));
		const ids = values[k] as number[];
		if (ids.length < 3) throw new MeshParseError(`PLY face ${this.done + 1}: ${ids.length} vertices (at least 3)`);
		for (const id of ids)
			if (!Number.isInteger(id) || id < 0 || id >= this.vertexCount)
				throw new MeshParseError(`PLY face ${this.done + 1}: vertex index ${id} is outside 0…${this.vertexCount - 1}`);
		for (let j = 1; j + 1 < ids.length; j++) {
			this.indices.push(ids[0]);
			this.indices.push(ids[j]);
			this.indices.push(ids[j + 1]);
		}
	}

	private element(values: (number | number[])[]) {
		const el = this.elements[this.el];
		if (el.name === 'vertex') this.vertex(values, el.props);
		else if (el.name === 'face') this.face(values, el.props);
		this.done++;
		this.skipEmpty();
	}

	private asciiLine(raw: string) {
		const line = raw.trim();
		if (!line) return;
		if (this.el >= this.elements.length) throw new MeshParseError(`PLY body line ${this.lines!.line}: more data than the header declares`);
		const w = line.split(WS).map(Number);
		const el = this.elements[this.el];
		const values: (number | number[])[] = [];
		let at = 0;
		for (const p of el.props) {
			if (p.list) {
				const n = w[at++];
				if (!Number.isInteger(n) || at + n > w.length) throw new MeshParseError(`PLY body line ${this.lines!.line}: list "${p.name}" is short`);
				values.push(w.slice(at, at + n));
				at += n;
			} else {
				if (at >= w.length) throw new MeshParseError(`PLY body line ${this.lines!.line}: property "${p.name}" is missing`);
				values.push(w[at++]);
			}
		}
		this.element(values);
	}

	private pushBinary(c: Uint8Array) {
		if (this.buf.length) {
			const joined = new Uint8Array(this.buf.length + c.length);
			joined.set(this.buf);
			joined.set(c, this.buf.length);
			c = joined;
		}
		const little = this.format === 'binary_little_endian';
		const view = new DataView(c.buffer, c.byteOffset, c.byteLength);
		let at = 0;
		outer: while (this.el < this.elements.length) {
			const el = this.elements[this.el];
			const values: (number | number[])[] = [];
			let p = at;
			for (const prop of el.props) {
				if (prop.list) {
					if (p + PLY_SIZE[prop.list] > c.length) break outer;
					const n = readPly(view, p, prop.list, little);
					p += PLY_SIZE[prop.list];
					if (p + n * PLY_SIZE[prop.type] > c.length) break outer;
					const ids = new Array<number>(n);
					for (let j = 0; j < n; j++, p += PLY_SIZE[prop.type]) ids[j] = readPly(view, p, prop.type, little);
					values.push(ids);
				} else {
					if (p + PLY_SIZE[prop.type] > c.length) break outer;
					values.push(readPly(view, p, prop.type, little));
					p += PLY_SIZE[prop.type];
				}
			}
			this.element(values);
			at = p;
		}
		this.buf = c.slice(at);
	}

	end(): ParsedMesh {
		if (this.inHeader) throw new MeshParseError(this.headerText.startsWith('ply') ? 'truncated PLY: the header has no "end_header"' : 'not a PLY file: it does not start with "ply"');
		this.lines?.end();
		if (this.el < this.elements.length) {
			const el = this.elements[this.el];
			throw new MeshParseError(`truncated PLY: ${this.done} of ${el.count} "${el.name}" elements read`);
		}
		const label = this.format === 'ascii' ? 'ASCII PLY' : this.format === 'binary_little_endian' ? 'binary PLY (little-endian)' : 'binary PLY (big-endian)';
		return finish(this.positions.array(), this.indices.array(), label);
	}
}

// ---------------------------------------------------------------- OBJ

class ObjParser implements MeshParser {
	private positions = new F32List();
	private indices = new U32List();
	private count = 0;
	private lines = new LineSplitter((l) => this.line(l));
	private faces: number[][] = [];

	push(chunk: Uint8Array) {
		this.lines.push(chunk);
	}

	private line(raw: string) {
		const line = raw.trim();
		if (!line || line[0] === '#') return;
		const w = line.split(WS);
		if (w[0] === 'v') {
			if (w.length < 4) throw new MeshParseError(`OBJ line ${this.lines.line}: "v" needs three coordinates`);
			const x = Number(w[1]);
			const y = Number(w[2]);
			const z = Number(w[3]);
			finite(x, y, z, () => `OBJ line ${this.lines.line}`);
			this.positions.push3(x, y, z);
			this.count++;
		} else if (w[0] === 'f') {
			if (w.length < 4) throw new MeshParseError(`OBJ line ${this.lines.line}: a face needs at least 3 vertices`);
			const ids = w.slice(1).map((ref) => {
				const n = Number(ref.split('/')[0]);
				if (!Number.isInteger(n) || n === 0) throw new MeshParseError(`OBJ line ${this.lines.line}: "${ref}" is not a vertex reference`);
				const id = n > 0 ? n - 1 : this.count + n;
				if (id < 0 || id >= this.count) throw new MeshParseError(`OBJ line ${this.lines.line}: vertex ${n} is not defined above this face`);
				return id;
			});
			for (let j = 1; j + 1 < ids.length; j++) {
				this.indices.push(ids[0]);
				this.indices.push(ids[j]);
				this.indices.push(ids[j + 1]);
			}
		} else if (!/^(vt|vn|vp|o|g|s|usemtl|mtllib|l|p|cstype|deg|curv|surf|parm|end)$/.test(w[0])) {
			throw new MeshParseError(`OBJ line ${this.lines.line}: "${w[0].slice(0, 20)}" is not an OBJ statement`);
		}
	}

	end(): ParsedMesh {
		this.lines.end();
		if (this.count === 0 && this.indices.length === 0) throw new MeshParseError('not an OBJ file: no "v" vertex lines');
		void this.faces;
		return finish(this.positions.array(), this.indices.array(), 'OBJ');
	}
}
