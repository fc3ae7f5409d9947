/**
 * Plan templates for the guided start: every `templates/*.json` file, read as text at build
 * time and validated with the same `parsePlan` as any imported plan file.
 */
import { parsePlan, type Plan } from '$core/plan';

export interface PlanTemplate {
	/** File name without `.json`, e.g. "demo". */
	key: string;
	title: string;
	/** First sentence of the template's notes, for the chooser. */
	blurb: string;
	plan: Plan;
}

const files = import.meta.glob('/templates/*.json', { eager: true, query: '?raw', import: 'default' }) as Record<string, string>;

/** The key of the template stored as a plan on first start. */
export const DEMO_TEMPLATE = 'demo';

function firstSentence(text: string): string {
	const m = /^(.+?[.!?])(\s|$)/.exec(text.trim());
	return m ? m[1] : text.trim();
}

/** Parses every template; a broken template is a build mistake and throws naming its file. */
function load(): PlanTemplate[] {
	return Object.entries(files)
		.map(([path, text]) => {
			const key = path.replace(/^.*\//, '').replace(/\.json$/, '');
			let plan: Plan;
			try {
				plan = parsePlan(text);
			} catch (err) {
				throw new Error(`templates/${key}.json: ${(err as Error).message}`);
			}
			return { key, title: plan.title, blurb: firstSentence(plan.notes), plan };
		})
		.sort((a, b) => (a.key === DEMO_TEMPLATE ? -1 : b.key === DEMO_TEMPLATE ? 1 : a.title.localeCompare(b.title)));
}

/** All templates, the demo first, then by title. Each call returns fresh copies of the plans. */
export function listTemplates(): PlanTemplate[] {
	return load();
}

/** One template by key (fresh copy), or undefined. */
export function getTemplate(key: string): PlanTemplate | undefined {
	return load().find((t) => t.key === key);
}
