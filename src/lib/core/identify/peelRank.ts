/**
 * Exact rank reduction by peeling singletons, with no fill-in.
 *
 * If column c has a single nonzero a at row r, column operations clear row r from every other
 * column without touching anything else, so rank(M) = 1 + rank(M without row r and column c).
 * The same holds for a row with a single nonzero (row operations). Repeating this on the sparse
 * effect matrices of a plan usually peels them completely; what is left (the core: rows and
 * columns with ≥ 2 nonzeros each) goes to dense exact elimination. The pattern must be the
 * exact nonzero pattern (stated effects of exactly 0 excluded).
 */
export interface PeelResult {
	/** Rank removed by peeling (each peel adds exactly 1). */
	peeled: number;
	/** Rows and columns left in the core, ascending. */
	coreRows: number[];
	coreCols: number[];
}

/**
 * @param nRows rows of the matrix
 * @param colRows `colRows[c]` rows where column c is nonzero
 * @param rowCols `rowCols[r]` columns with a nonzero in row r
 * @param active mask over columns (1 = part of the matrix)
 * @param cap stop once this much rank is peeled (the core is then irrelevant and returned empty)
 */
export function peelRank(nRows: number, colRows: ArrayLike<number>[], rowCols: ArrayLike<number>[], active: Uint8Array, cap = Infinity): PeelResult {
	const nCols = colRows.length;
	const colCount = new Int32Array(nCols);
	const rowCount = new Int32Array(nRows);
	const colAlive = new Uint8Array(nCols);
	const rowAlive = new Uint8Array(nRows);
	for (let c = 0; c < nCols; c++)
		if (active[c] && colRows[c].length) {
			colAlive[c] = 1;
			colCount[c] = colRows[c].length;
			for (let k = 0; k < colRows[c].length; k++) rowCount[colRows[c][k]]++;
		}
	// Stack entries: column c as c, row r as nCols + r.
	const stack: number[] = [];
	for (let r = 0; r < nRows; r++) {
		rowAlive[r] = rowCount[r] > 0 ? 1 : 0;
		if (rowCount[r] === 1) stack.push(nCols + r);
	}
	for (let c = 0; c < nCols; c++) if (colCount[c] === 1) stack.push(c);
	let peeled = 0;
	const pivot = (r: number, c: number) => {
		peeled++;
		rowAlive[r] = 0;
		colAlive[c] = 0;
		const cols = rowCols[r];
		for (let k = 0; k < cols.length; k++) {
			const x = cols[k];
			if (!colAlive[x]) continue;
			if (--colCount[x] === 1) stack.push(x);
			else if (colCount[x] === 0) colAlive[x] = 0;
		}
		const rows = colRows[c];
		for (let k = 0; k < rows.length; k++) {
			const y = rows[k];
			if (!rowAlive[y]) continue;
			if (--rowCount[y] === 1) stack.push(nCols + y);
			else if (rowCount[y] === 0) rowAlive[y] = 0;
		}
	};
	while (stack.length && peeled < cap) {
		const x = stack.pop()!;
		if (x < nCols) {
			if (!colAlive[x] || colCount[x] !== 1) continue;
			const rows = colRows[x];
			let r = -1;
			for (let k = 0; k < rows.length && r < 0; k++) if (rowAlive[rows[k]]) r = rows[k];
			pivot(r, x);
		} else {
			const r = x - nCols;
			if (!rowAlive[r] || rowCount[r] !== 1) continue;
			const cols = rowCols[r];
			let c = -1;
			for (let k = 0; k < cols.length && c < 0; k++) if (colAlive[cols[k]]) c = cols[k];
			pivot(r, c);
		}
	}
	if (peeled >= cap) return { peeled, coreRows: [], coreCols: [] };
	const coreRows: number[] = [];
	const coreCols: number[] = [];
	for (let r = 0; r < nRows; r++) if (rowAlive[r] && rowCount[r] > 0) coreRows.push(r);
	for (let c = 0; c < nCols; c++) if (colAlive[c] && colCount[c] > 0) coreCols.push(c);
	return { peeled, coreRows, coreCols };
}
