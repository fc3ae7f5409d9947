/**
 * Maximum bipartite matching between rows (factors) and columns (reagents) of a sparse
 * nonzero pattern, by augmenting paths (Kuhn's method) after a greedy start.
 * Its size is the structural (generic) rank of the pattern: the rank that almost every choice
 * of values on those nonzeros attains.
 */
export interface Matching {
	/** Column matched to each row, or −1. */
	rowMate: Int32Array;
	/** Row matched to each column, or −1. */
	colMate: Int32Array;
	size: number;
}

/**
 * @param nRows number of rows
 * @param nCols number of columns
 * @param rowCols `rowCols[i]` lists the columns with a nonzero in row i
 * @param active optional mask over columns (1 = take part); absent = every column
 */
export function maximumMatching(nRows: number, nCols: number, rowCols: ArrayLike<number>[], active?: Uint8Array): Matching {
	const rowMate = new Int32Array(nRows).fill(-1);
	const colMate = new Int32Array(nCols).fill(-1);
	const seen = new Int32Array(nCols).fill(-1);
	let size = 0;
	const usable = (c: number) => !active || active[c] === 1;
	// Greedy start.
	for (let i = 0; i < nRows; i++) {
		const cols = rowCols[i];
		for (let k = 0; k < cols.length; k++) {
			const c = cols[k];
			if (colMate[c] < 0 && usable(c)) {
				rowMate[i] = c;
				colMate[c] = i;
				size++;
				break;
			}
		}
	}
	const augment = (i: number, stamp: number): boolean => {
		const cols = rowCols[i];
		for (let k = 0; k < cols.length; k++) {
			const c = cols[k];
			if (seen[c] === stamp || !usable(c)) continue;
			seen[c] = stamp;
			if (colMate[c] < 0 || augment(colMate[c], stamp)) {
				rowMate[i] = c;
				colMate[c] = i;
				return true;
			}
		}
		return false;
	};
	for (let i = 0; i < nRows; i++) if (rowMate[i] < 0 && augment(i, i)) size++;
	return { rowMate, colMate, size };
}

/**
 * Rows left unmatched by at least one maximum matching — equivalently, rows whose deletion does
 * not lower the structural rank: the generic support of the left null space. Found by
 * alternating-path search from the rows `matching` leaves unmatched (Dulmage–Mendelsohn).
 * Returns a 0/1 mask over rows.
 */
export function structuralNullSupport(matching: Matching, rowCols: ArrayLike<number>[], active?: Uint8Array): Uint8Array {
	const nRows = matching.rowMate.length;
	const reached = new Uint8Array(nRows);
	const queue: number[] = [];
	for (let i = 0; i < nRows; i++)
		if (matching.rowMate[i] < 0) {
			reached[i] = 1;
			queue.push(i);
		}
	while (queue.length) {
		const i = queue.pop()!;
		const cols = rowCols[i];
		for (let k = 0; k < cols.length; k++) {
			const c = cols[k];
			if (active && active[c] !== 1) continue;
			// c is matched: otherwise an augmenting path would exist and the matching not be maximum.
			const r = matching.colMate[c];
			if (r >= 0 && !reached[r]) {
				reached[r] = 1;
				queue.push(r);
			}
		}
	}
	return reached;
}
