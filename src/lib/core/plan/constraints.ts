/**
 * One declared table of field constraints. The same table validates plan files, bounds form
 * inputs in the notebook and writes the error text, e.g.
 * "budget.plateCost: expected a number ≥ 0, got -3".
 */

export interface NumberRule {
	kind: 'number';
	min?: number;
	max?: number;
	/** When true, `min` itself is not allowed. */
	minExclusive?: boolean;
	maxExclusive?: boolean;
	integer?: boolean;
	optional?: boolean;
	/** Plain-words description for forms. */
	help: string;
}
export interface StringRule {
	kind: 'string';
	nonEmpty?: boolean;
	maxLength?: number;
	optional?: boolean;
	pattern?: RegExp;
	patternText?: string;
	help: string;
}
export interface BooleanRule {
	kind: 'boolean';
	optional?: boolean;
	help: string;
}
export interface EnumRule {
	kind: 'enum';
	values: readonly (string | number)[];
	optional?: boolean;
	help: string;
}
export type FieldRule = NumberRule | StringRule | BooleanRule | EnumRule;

const ID_PATTERN = /^[A-Za-z][A-Za-z0-9_.-]{0,39}$/;
const ID_TEXT = 'an id of 1–40 letters, digits, "_", "." or "-" starting with a letter';

export const idRule: StringRule = { kind: 'string', nonEmpty: true, pattern: ID_PATTERN, patternText: ID_TEXT, help: 'Short identifier used in files and CSVs.' };
const nameRule: StringRule = { kind: 'string', nonEmpty: true, maxLength: 200, help: 'Display name.' };

export const factorRules = {
	id: idRule,
	name: nameRule,
	shape: { kind: 'enum', values: ['gaussian', 'laplace', 'uniform', 'bimodal'], help: 'Distribution of the factor across cells or wells (unit variance).' }
} satisfies Record<string, FieldRule>;

export const reagentRules = {
	id: idRule,
	name: nameRule,
	expectedTargets: { kind: 'number', integer: true, min: 1, optional: true, help: 'Expected number of target factors when the targets are unknown.' },
	kind: { kind: 'enum', values: ['shift', 'clamp', 'scale'], help: 'shift adds to the targets; clamp fixes them (hard intervention); scale widens their spread.' },
	effectCv: { kind: 'number', min: 0, max: 5, optional: true, help: 'Relative uncertainty of the effect (coefficient of variation).' },
	efficacy: { kind: 'number', min: 0, minExclusive: true, max: 1, help: 'Share of wells in which the reagent acts, in (0, 1].' },
	costPerWell: { kind: 'number', min: 0, help: 'Reagent cost per well, in the budget currency.' },
	maxWells: { kind: 'number', integer: true, min: 0, optional: true, help: 'Stock limit in wells (empty = unlimited).' }
} satisfies Record<string, FieldRule>;

/** Effect size bounds: any finite number within ±20 SD units. */
export const effectRule: NumberRule = { kind: 'number', min: -20, max: 20, help: 'Effect in factor SD units (for clamp: the clamped value; for scale: relative change of the spread, > −1).' };

export const contextRules = {
	id: idRule,
	name: nameRule,
	level: { kind: 'enum', values: ['plate', 'well'], help: 'plate: whole plates share the context; well: mixed within plates.' }
} satisfies Record<string, FieldRule>;

export const contextMeanRule: NumberRule = { kind: 'number', min: -20, max: 20, help: 'Mean of the factor in this context (SD units).' };
export const contextVarianceRule: NumberRule = { kind: 'number', min: 0, minExclusive: true, max: 100, help: 'Variance of the factor in this context (baseline 1).' };

export const observationRules = {
	features: { kind: 'number', integer: true, min: 1, max: 100000, help: 'Number of measured features per well.' },
	mixing: { kind: 'enum', values: ['linear', 'nonlinear'], help: 'How factors map to features.' },
	nonlinearity: { kind: 'number', min: 0, max: 1, maxExclusive: true, help: 'Strength λ of the invertible residual branch, in [0, 1).' },
	cellsPerWell: { kind: 'number', integer: true, min: 0, max: 100000, help: 'Cells imaged per well; 0 simulates well profiles only.' },
	replicateNoise: { kind: 'number', min: 0, max: 100, help: 'Well-to-well noise SD in factor units.' },
	measurementNoise: { kind: 'number', min: 0, max: 100, help: 'Measurement noise SD per feature.' },
	plateEffect: { kind: 'number', min: 0, max: 100, help: 'Plate-to-plate offset SD per feature.' }
} satisfies Record<string, FieldRule>;

export const budgetRules = {
	total: { kind: 'number', min: 0, help: 'Total budget for the experiment.' },
	currency: { kind: 'string', nonEmpty: true, maxLength: 12, help: 'Currency label, e.g. EUR.' },
	plateFormat: { kind: 'enum', values: [96, 384, 1536], help: 'Wells per plate (ANSI/SLAS 4-2004 formats).' },
	plateCost: { kind: 'number', min: 0, help: 'Cost of one plate run (plate, media, imaging).' },
	fixedCost: { kind: 'number', min: 0, help: 'Fixed costs independent of the design.' },
	excludeEdgeWells: { kind: 'boolean', help: 'Leave the outer ring of wells empty.' },
	controlsPerPlate: { kind: 'number', integer: true, min: 0, help: 'Negative-control wells on every plate.' }
} satisfies Record<string, FieldRule>;

export const goalRules = {
	mcc: { kind: 'number', min: 0, minExclusive: true, max: 1, help: 'Recovery score (MCC) to reach, in (0, 1].' },
	assurance: { kind: 'number', min: 0, minExclusive: true, max: 1, maxExclusive: true, help: 'Required probability of reaching the score, in (0, 1).' },
	route: { kind: 'enum', values: ['auto', 'targeted', 'contexts', 'observational'], help: 'Identifiability route relied on; auto evaluates all.' }
} satisfies Record<string, FieldRule>;

export const designRules = {
	replicates: { kind: 'number', integer: true, min: 1, max: 10000, help: 'Replicate wells per reagent and context.' },
	controlsPerPlate: { kind: 'number', integer: true, min: 0, help: 'Negative-control wells on every plate.' },
	cellsPerWell: { kind: 'number', integer: true, min: 0, max: 100000, optional: true, help: 'Cells imaged per well.' },
	plates: { kind: 'number', integer: true, min: 1, optional: true, help: 'Number of plates.' }
} satisfies Record<string, FieldRule>;

/**
 * Seed of every random result (simulation, sizing, layout, pilot permutations, report): one range
 * for the command line and the notebook alike.
 */
export const seedRule: NumberRule = { kind: 'number', integer: true, min: 0, max: 4294967295, help: 'Seed of every random draw; the same plan and seed give the same result.' };

/** Plain-words statement of what a rule expects, used in every error message. */
export function describeRule(rule: FieldRule): string {
	switch (rule.kind) {
		case 'boolean':
			return 'true or false';
		case 'enum':
			return `one of ${rule.values.map((v) => JSON.stringify(v)).join(', ')}`;
		case 'string':
			if (rule.pattern) return rule.patternText ?? `a string matching ${rule.pattern}`;
			return rule.nonEmpty ? `a non-empty string${rule.maxLength ? ` of at most ${rule.maxLength} characters` : ''}` : 'a string';
		case 'number': {
			const noun = rule.integer ? 'an integer' : 'a number';
			const lo = rule.min;
			const hi = rule.max;
			if (lo !== undefined && hi !== undefined) {
				return `${noun} in ${rule.minExclusive ? '(' : '['}${lo}, ${hi}${rule.maxExclusive ? ')' : ']'}`;
			}
			if (lo !== undefined) return `${noun} ${rule.minExclusive ? '>' : '≥'} ${lo}`;
			if (hi !== undefined) return `${noun} ${rule.maxExclusive ? '<' : '≤'} ${hi}`;
			return `a finite ${rule.integer ? 'integer' : 'number'}`;
		}
	}
}

/** Returns null when `value` satisfies `rule`, otherwise the expectation text. */
export function checkRule(rule: FieldRule, value: unknown): string | null {
	const expected = describeRule(rule);
	switch (rule.kind) {
		case 'boolean':
			return typeof value === 'boolean' ? null : expected;
		case 'enum':
			return rule.values.includes(value as string | number) ? null : expected;
		case 'string':
			if (typeof value !== 'string') return expected;
			if (rule.nonEmpty && value.trim() === '') return expected;
			if (rule.maxLength !== undefined && value.length > rule.maxLength) return expected;
			if (rule.pattern && !rule.pattern.test(value)) return expected;
			return null;
		case 'number': {
			if (typeof value !== 'number' || !Number.isFinite(value)) return expected;
			if (rule.integer && !Number.isInteger(value)) return expected;
			if (rule.min !== undefined && (rule.minExclusive ? value <= rule.min : value < rule.min)) return expected;
			if (rule.max !== undefined && (rule.maxExclusive ? value >= rule.max : value > rule.max)) return expected;
			return null;
		}
	}
}

/** Formats a value for an error message without ever printing "undefined" loosely. */
export function showValue(value: unknown): string {
	if (value === undefined) return 'nothing';
	if (typeof value === 'number' && !Number.isFinite(value)) return String(value);
	try {
		const s = JSON.stringify(value);
		return s.length > 60 ? s.slice(0, 57) + '…' : s;
	} catch {
		return String(value);
	}
}
