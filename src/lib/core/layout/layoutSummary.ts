import type { Layout, LayoutDiagnostics } from './types';

/**
 * What the `layout` command prints with --json: the number of plates, the number of wells in
 * use (treatment + control; empty and excluded wells are not counted) and the diagnostics.
 */
export function layoutSummary(layout: Layout): { plates: number; wells: number; diagnostics: LayoutDiagnostics } {
	const { treatment, control } = layout.diagnostics.counts;
	return { plates: layout.plates.length, wells: treatment + control, diagnostics: layout.diagnostics };
}
