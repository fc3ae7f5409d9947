/**
 * The working representation of a layout while it is built and optimised. Only the usable
 * grid is represented (the excluded edge is not part of it): `rows × columns` cells per plate,
 * cell index `row * columns + col` in usable-grid coordinates.
 */
export interface Placement {
	/** Usable rows and columns per plate. */
	rows: number;
	columns: number;
	plates: number;
	/**
	 * `occ[p * rows * columns + cell]`: `CONTROL`, `EMPTY`, or a slot index. A slot is one
	 * (plate, group) pair; all wells of a group on one plate share its slot.
	 */
	occ: Int32Array;
	slotGroup: Int32Array;
	slotPlate: Int32Array;
	groups: number;
	/** Replicates of each (reagent, context) group. */
	groupReplicates: Int32Array;
	/** Plate block (plates sharing one context setting) of each group and of each plate. */
	groupBlock: Int32Array;
	plateBlock: Int32Array;
	blocks: number;
	/** Distance-to-edge category of each cell (0 = outermost usable ring) and the number of categories. */
	ring: Int32Array;
	rings: number;
}

export const CONTROL = -2;
export const EMPTY = -1;
