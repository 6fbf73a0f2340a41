// Seeded pseudo-random numbers for repeatable Monte Carlo studies (no units).
// Generator: xoshiro128** 1.1 (D. Blackman and S. Vigna, "Scrambled linear pseudorandom number generators",
// ACM TOMS 47(4), 2021; reference C code at prng.di.unimi.it), seeded through SplitMix32 (the 32-bit
// variant of Steele, Lea and Flood's SplitMix, "Fast splittable pseudorandom number generators", OOPSLA 2014).
// Normal deviates by the Marsaglia polar method (Marsaglia and Bray, SIAM Review 6(3), 1964).

/** One SplitMix32 step of state s: returns [next state, output], both unsigned 32-bit. */
function splitmix32(s: number): [number, number] {
	s = (s + 0x9e3779b9) >>> 0;
	let z = s;
	z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
	z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
	return [s, (z ^ (z >>> 16)) >>> 0];
}

/** xoshiro128** with a cached second normal deviate. */
export class Random {
	private a = 0;
	private b = 0;
	private c = 0;
	private d = 0;
	private spare = 0;
	private hasSpare = false;

	/** A generator for stream `stream` of seed `seed` (both integers); streams of one seed are independent. */
	constructor(seed: number, stream = 0) {
		this.reseed(seed, stream);
	}

	/** Restart at stream `stream` of `seed`, allocating nothing. */
	reseed(seed: number, stream = 0): void {
		let s = (seed ^ Math.imul(stream + 1, 0x632be5ab)) >>> 0;
		let o: number;
		[s, o] = splitmix32(s);
		this.a = o;
		[s, o] = splitmix32(s);
		this.b = o;
		[s, o] = splitmix32(s);
		this.c = o;
		[s, o] = splitmix32(s ^ (stream >>> 0));
		this.d = o;
		if ((this.a | this.b | this.c | this.d) === 0) this.d = 1; // the all-zero state is the one forbidden state
		this.hasSpare = false;
	}

	/** The next unsigned 32-bit output. */
	nextUint32(): number {
		const r = Math.imul(rotl(Math.imul(this.b, 5), 7), 9) >>> 0;
		const t = this.b << 9;
		this.c ^= this.a;
		this.d ^= this.b;
		this.b ^= this.c;
		this.a ^= this.d;
		this.c ^= t;
		this.d = rotl(this.d, 11);
		return r;
	}

	/** Uniform in [0, 1) with 32 bits of resolution. */
	uniform(): number {
		return this.nextUint32() / 4294967296;
	}

	/** Uniform in (-1, 1). */
	symmetric(): number {
		return 2 * ((this.nextUint32() + 0.5) / 4294967296) - 1;
	}

	/** A standard normal deviate (mean 0, standard deviation 1), Marsaglia polar method. */
	normal(): number {
		if (this.hasSpare) {
			this.hasSpare = false;
			return this.spare;
		}
		let u: number;
		let v: number;
		let s: number;
		do {
			u = this.symmetric();
			v = this.symmetric();
			s = u * u + v * v;
		} while (s >= 1 || s === 0);
		const f = Math.sqrt((-2 * Math.log(s)) / s);
		this.spare = v * f;
		this.hasSpare = true;
		return u * f;
	}
}

/** 32-bit left rotation. */
function rotl(x: number, k: number): number {
	return ((x << k) | (x >>> (32 - k))) >>> 0;
}
