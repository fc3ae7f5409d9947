/**
 * Colours of the notebook's charts, chosen for this app (they match its teal accent) and
 * for contrast on white: series colours are told apart by hue and lightness, and every chart
 * also labels its series in words, so colour is never the only cue.
 */

/** Series colours in the order they are used. */
export const SERIES_COLOURS = [
	'#2b5d6b', // deep teal (the app's accent)
	'#c0762b', // amber
	'#6b4f8f', // heather
	'#4d7c3a', // fern
	'#a5473a', // rust
	'#56656e' // slate
] as const;

/** Reference lines (goal, budget) and their labels. */
export const REFERENCE_COLOUR = '#1d2528';
/** A highlighted point (e.g. the recommended design). */
export const HIGHLIGHT_COLOUR = '#b3261e';
/** Axis text and grid. */
export const TEXT_COLOUR = '#4f5a5e';
export const GRID_COLOUR = '#e4e6e1';

/** Series colour `i` (cycling). */
export function seriesColour(i: number): string {
	return SERIES_COLOURS[((i % SERIES_COLOURS.length) + SERIES_COLOURS.length) % SERIES_COLOURS.length];
}

/** `#rrggbb` with an alpha in [0, 1], as `rgba(…)`. */
export function withAlpha(hex: string, alpha: number): string {
	const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
	if (!m) throw new RangeError(`withAlpha: expected a colour "#rrggbb", got ${JSON.stringify(hex)}`);
	if (!(alpha >= 0 && alpha <= 1)) throw new RangeError(`withAlpha: alpha must be in [0, 1], got ${alpha}`);
	return `rgba(${parseInt(m[1], 16)}, ${parseInt(m[2], 16)}, ${parseInt(m[3], 16)}, ${alpha})`;
}
