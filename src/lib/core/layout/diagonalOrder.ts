/**
 * An order of the cells of an R × K grid in which any run of at most min(R, K − 1) consecutive
 * cells lies on distinct rows and distinct columns (all plate formats have R < K, so runs of up
 * to R cells), and every prefix covers the rows and the columns as evenly as possible (counts
 * differ by at most one).
 *
 * Cell j sits at row j mod R and column (j + ⌊j / L⌋) mod K with L = lcm(R, K): each block of
 * L cells walks one family of wrapped diagonals, the next block the family shifted by one
 * column, and the gcd(R, K) blocks together cover the grid once. Row and column permutations
 * keep all these properties, so the caller randomises with them.
 *
 * Returns cell indices `row * K + col` (row-major), after applying `rowPerm` and `colPerm`.
 */
export function diagonalOrder(rows: number, columns: number, rowPerm?: ArrayLike<number>, colPerm?: ArrayLike<number>): Int32Array {
	if (!Number.isInteger(rows) || !Number.isInteger(columns) || rows < 1 || columns < 1) throw new RangeError(`grid must be at least 1 × 1, got ${rows} × ${columns}`);
	const l = (rows / gcd(rows, columns)) * columns;
	const out = new Int32Array(rows * columns);
	for (let j = 0; j < out.length; j++) {
		const r = j % rows;
		const c = (j + Math.floor(j / l)) % columns;
		out[j] = (rowPerm ? rowPerm[r] : r) * columns + (colPerm ? colPerm[c] : c);
	}
	return out;
}

function gcd(a: number, b: number): number {
	while (b) [a, b] = [b, a % b];
	return a;
}
