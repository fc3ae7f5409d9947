/** One benchmark workload: `run(rep)` does one replicate and returns its MCC when it scores one. */
export interface Workload {
	reps: number;
	setup?(): Promise<void> | void;
	run(rep: number): Promise<number | void> | number | void;
}
