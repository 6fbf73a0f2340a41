// Small dense linear algebra for the feature fits (client-safe, plain numbers): Gaussian elimination with partial
// pivoting for n ≤ 6, and the Jacobi eigenvalue method for symmetric 3 × 3 matrices.

/** Solves A x = b (A n × n, row-major arrays; both copied); null when A is singular. */
export function solve(A: number[][], b: number[]): number[] | null {
	const n = b.length;
	const M = A.map((row, i) => [...row, b[i]]);
	for (let c = 0; c < n; c++) {
		let p = c;
		for (let r = c + 1; r < n; r++) if (Math.abs(M[r][c]) > Math.abs(M[p][c])) p = r;
		if (Math.abs(M[p][c]) < 1e-300) return null;
		[M[c], M[p]] = [M[p], M[c]];
		for (let r = c + 1; r < n; r++) {
			const f = M[r][c] / M[c][c];
			if (f === 0) continue;
			for (let k = c; k <= n; k++) M[r][k] -= f * M[c][k];
		}
	}
	const x = new Array<number>(n).fill(0);
	for (let r = n - 1; r >= 0; r--) {
		let s = M[r][n];
		for (let k = r + 1; k < n; k++) s -= M[r][k] * x[k];
		x[r] = s / M[r][r];
	}
	return x.every(Number.isFinite) ? x : null;
}

/** Least squares min |J x − r|² through the normal equations (JᵀJ) x = Jᵀ r; rows of J given one by one. */
export class NormalEquations {
	readonly A: number[][];
	readonly b: number[];
	constructor(readonly n: number) {
		this.A = Array.from({ length: n }, () => new Array<number>(n).fill(0));
		this.b = new Array<number>(n).fill(0);
	}
	add(row: ArrayLike<number>, rhs: number) {
		for (let i = 0; i < this.n; i++) {
			this.b[i] += row[i] * rhs;
			for (let j = 0; j < this.n; j++) this.A[i][j] += row[i] * row[j];
		}
	}
	solve(damping = 0): number[] | null {
		const A = this.A.map((r, i) => r.map((v, j) => (i === j ? v * (1 + damping) + 1e-300 : v)));
		return solve(A, this.b);
	}
}

/** Eigen-decomposition of a symmetric 3 × 3 matrix (Jacobi): values ascending, vectors[i] the unit vector of values[i]. */
export function symmetricEigen3(S: number[][]): { values: number[]; vectors: number[][] } {
	const a = S.map((r) => [...r]);
	const v = [
		[1, 0, 0],
		[0, 1, 0],
		[0, 0, 1]
	];
	for (let sweep = 0; sweep < 50; sweep++) {
		const off = a[0][1] ** 2 + a[0][2] ** 2 + a[1][2] ** 2;
		if (off < 1e-30 * (a[0][0] ** 2 + a[1][1] ** 2 + a[2][2] ** 2 + 1e-300)) break;
		for (const [p, q] of [
			[0, 1],
			[0, 2],
			[1, 2]
		]) {
			if (Math.abs(a[p][q]) < 1e-300) continue;
			const theta = (a[q][q] - a[p][p]) / (2 * a[p][q]);
			const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
			const c = 1 / Math.sqrt(t * t + 1);
			const s = t * c;
			for (let k = 0; k < 3; k++) {
				const akp = a[k][p];
				const akq = a[k][q];
				a[k][p] = c * akp - s * akq;
				a[k][q] = s * akp + c * akq;
			}
			for (let k = 0; k < 3; k++) {
				const apk = a[p][k];
				const aqk = a[q][k];
				a[p][k] = c * apk - s * aqk;
				a[q][k] = s * apk + c * aqk;
			}
			for (let k = 0; k < 3; k++) {
				const vkp = v[k][p];
				const vkq = v[k][q];
				v[k][p] = c * vkp - s * vkq;
				v[k][q] = s * vkp + c * vkq;
			}
		}
	}
	const order = [0, 1, 2].sort((i, j) => a[i][i] - a[j][j]);
	return { values: order.map((i) => a[i][i]), vectors: order.map((i) => [v[0][i], v[1][i], v[2][i]]) };
}
