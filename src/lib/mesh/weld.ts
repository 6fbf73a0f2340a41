// Welding of a triangle soup (STL stores every triangle's three corners): equal positions, bit for bit, become one
// vertex. Open addressing on the three float32 bit patterns; no strings, so 6 million corners weld in a second or so.

/** Collects unique xyz positions; add() returns the index of a position. */
export class VertexWelder {
	private keys = new Uint32Array(3 * 4096);
	private table = new Int32Array(8192).fill(-1);
	private count = 0;
	private f = new Float32Array(3);
	private u = new Uint32Array(this.f.buffer);

	add(x: number, y: number, z: number): number {
		this.f[0] = x;
		this.f[1] = y;
		this.f[2] = z;
		// -0 and +0 are the same point
		const a = this.f[0] === 0 ? 0 : this.u[0];
		const b = this.f[1] === 0 ? 0 : this.u[1];
		const c = this.f[2] === 0 ? 0 : this.u[2];
		const mask = this.table.length - 1;
		let h = (Math.imul(a, 0x9e3779b1) ^ Math.imul(b, 0x85ebca77) ^ Math.imul(c, 0xc2b2ae3d)) >>> 0;
		for (;;) {
			const slot = h & mask;
			const id = this.table[slot];
			if (id < 0) {
				const n = this.count++;
				if (3 * this.count > this.keys.length) {
					const next = new Uint32Array(this.keys.length * 2);
					next.set(this.keys);
					this.keys = next;
				}
				this.keys[3 * n] = a;
				this.keys[3 * n + 1] = b;
				this.keys[3 * n + 2] = c;
				this.table[slot] = n;
				if (this.count * 2 > this.table.length) this.grow();
				return n;
			}
			if (this.keys[3 * id] === a && this.keys[3 * id + 1] === b && this.keys[3 * id + 2] === c) return id;
			h++;
		}
	}

	private grow() {
		const table = new Int32Array(this.table.length * 2).fill(-1);
		const mask = table.length - 1;
		for (let n = 0; n < this.count; n++) {
			let h = (Math.imul(this.keys[3 * n], 0x9e3779b1) ^ Math.imul(this.keys[3 * n + 1], 0x85ebca77) ^ Math.imul(this.keys[3 * n + 2], 0xc2b2ae3d)) >>> 0;
			while (table[h & mask] >= 0) h++;
			table[h & mask] = n;
		}
		this.table = table;
	}

	/** The unique positions as float32 xyz. */
	positions(): Float32Array {
		return new Float32Array(this.keys.buffer.slice(0, 12 * this.count));
	}
}
