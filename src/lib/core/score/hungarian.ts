/**
 * Minimum-cost one-to-one assignment (linear sum assignment) by the Hungarian algorithm
 * (Kuhn 1955; Munkres 1957) in its O(n²·m) shortest-augmenting-path form with row and column
 * potentials. `cost` has n rows and m columns; when n ≤ m every row gets a distinct column,
 * when n > m every column gets a distinct row and the remaining rows get −1.
 * Throws on a ragged or non-finite matrix (a caller mistake).
 */
export interface Assignment {
	/** assignment[i] = column of row i, or −1 when row i is left out (n > m). */
	assignment: number[];
	/** Sum of the assigned costs. */
	cost: number;
}

export function hungarian(cost: readonly (readonly number[])[]): Assignment {
	const n = cost.length;
	if (n === 0) return { assignment: [], cost: 0 };
	const m = cost[0].length;
	for (let i = 0; i < n; i++) {
		if (cost[i].length !== m) throw new RangeError(`hungarian: cost row ${i} has ${cost[i].length} entries, expected ${m}`);
		for (let j = 0; j < m; j++) if (!Number.isFinite(cost[i][j])) throw new RangeError(`hungarian: cost[${i}][${j}] must be a finite number, got ${cost[i][j]}`);
	}
	if (m === 0) return { assignment: new Array(n).fill(-1), cost: 0 };
	if (n > m) {
		const t: number[][] = Array.from({ length: m }, (_, j) => Array.from({ length: n }, (_, i) => cost[i][j]));
		const inner = hungarian(t);
		const assignment = new Array<number>(n).fill(-1);
		inner.assignment.forEach((row, col) => (assignment[row] = col));
		return { assignment, cost: inner.cost };
	}
	const rowOfCol = solveRowsLeqCols(n, m, (i, j) => cost[i][j]);
	const assignment = new Array<number>(n).fill(-1);
	let total = 0;
	for (let j = 0; j < m; j++) {
		const i = rowOfCol[j];
		if (i >= 0) {
			assignment[i] = j;
			total += cost[i][j];
		}
	}
	return { assignment, cost: total };
}

/**
 * Core for n ≤ m on an accessor; returns for each column its row (−1 when unused).
 * Potentials u (rows) and v (columns) keep reduced costs c(i,j) − u_i − v_j ≥ 0; each row is
 * added by a Dijkstra-like search for the cheapest augmenting path.
 */
export function solveRowsLeqCols(n: number, m: number, c: (i: number, j: number) => number): Int32Array {
	const u = new Float64Array(n + 1);
	const v = new Float64Array(m + 1);
	const p = new Int32Array(m + 1); // p[j] = 1-based row matched to column j (0 = none)
	const way = new Int32Array(m + 1);
	const minv = new Float64Array(m + 1);
	const used = new Uint8Array(m + 1);
	for (let i = 1; i <= n; i++) {
		p[0] = i;
		let j0 = 0;
		minv.fill(Infinity);
		used.fill(0);
		do {
			used[j0] = 1;
			const i0 = p[j0];
			let delta = Infinity;
			let j1 = -1;
			for (let j = 1; j <= m; j++) {
				if (used[j]) continue;
				const cur = c(i0 - 1, j - 1) - u[i0] - v[j];
				if (cur < minv[j]) {
					minv[j] = cur;
					way[j] = j0;
				}
				if (minv[j] < delta) {
					delta = minv[j];
					j1 = j;
				}
			}
			for (let j = 0; j <= m; j++) {
				if (used[j]) {
					u[p[j]] += delta;
					v[j] -= delta;
				} else minv[j] -= delta;
			}
			j0 = j1;
		} while (p[j0] !== 0);
		do {
			const j1 = way[j0];
			p[j0] = p[j1];
			j0 = j1;
		} while (j0 !== 0);
	}
	const rowOfCol = new Int32Array(m).fill(-1);
	for (let j = 1; j <= m; j++) if (p[j] > 0) rowOfCol[j - 1] = p[j] - 1;
	return rowOfCol;
}
