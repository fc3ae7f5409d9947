import { serializePlan, type Plan } from '$core/plan';
import { slug } from './format';

/** Offers `text` as a file download in the browser. */
export function downloadText(fileName: string, text: string, type = 'application/json'): void {
	const url = URL.createObjectURL(new Blob([text], { type }));
	const a = document.createElement('a');
	a.href = url;
	a.download = fileName;
	a.rel = 'noopener';
	document.body.appendChild(a);
	a.click();
	a.remove();
	setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** File name of an exported plan: "<title-slug>.plan.json" (with a suffix such as "-rev2"). */
export function planFileName(plan: Plan, suffix = ''): string {
	return `${slug(plan.title)}${suffix}.plan.json`;
}

/** Downloads a plan as a plan file (the canonical `serializePlan` text). */
export function downloadPlan(plan: Plan, suffix = ''): void {
	downloadText(planFileName(plan, suffix), serializePlan(plan));
}
