/** Fill, outline and label colours of one reagent in plate maps. */
export interface ReagentColour {
	fill: string;
	stroke: string;
	/** Colour of text drawn on the fill. */
	ink: string;
}

/** Golden angle in degrees: successive hues stay far apart for any count. */
const GOLDEN = 137.50776405;

/**
 * Colours for reagents in order. Reagents of the same group (see `reagentGroupsFromPlan`) share
 * a hue and differ in lightness; without groups every reagent gets its own hue and lightness
 * cycles over three steps so that neighbours in the list differ strongly. Deterministic in the
 * order of `reagents`, so every plate of a layout uses the same colours.
 */
export function reagentColours(reagents: readonly string[], groupOf: Record<string, string> = {}): Map<string, ReagentColour> {
	const groupOrder: string[] = [];
	const members = new Map<string, string[]>();
	for (const id of reagents) {
		const g = groupOf[id] ?? `\u0000${id}`;
		if (!members.has(g)) {
			members.set(g, []);
			groupOrder.push(g);
		}
		members.get(g)!.push(id);
	}
	const out = new Map<string, ReagentColour>();
	groupOrder.forEach((g, gi) => {
		const hue = (204 + gi * GOLDEN) % 360;
		const list = members.get(g)!;
		list.forEach((id, k) => {
			const light = list.length === 1 ? [47, 61, 37][gi % 3] : 34 + (32 * k) / (list.length - 1);
			const sat = 58 + (gi % 2) * 10;
			out.set(id, {
				fill: `hsl(${hue.toFixed(1)}, ${sat}%, ${light.toFixed(1)}%)`,
				stroke: `hsl(${hue.toFixed(1)}, ${sat}%, ${Math.max(18, light - 16).toFixed(1)}%)`,
				ink: light < 54 ? '#ffffff' : '#1a1a1a'
			});
		});
	});
	return out;
}
