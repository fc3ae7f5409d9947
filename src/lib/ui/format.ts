/** Small display helpers shared by the notebook's components. */

/** "1 234.5 EUR"-style amount with the plan's currency label, rounded to cents. */
export function money(amount: number, currency: string): string {
	if (!Number.isFinite(amount)) return `— ${currency}`;
	return `${amount.toLocaleString('en-GB', { maximumFractionDigits: 2, minimumFractionDigits: amount % 1 === 0 ? 0 : 2 })} ${currency}`;
}

/** Local date and time, e.g. "3 Dec 2025, 14:05". */
export function dateTime(ms: number): string {
	return new Date(ms).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

/** Time only, e.g. "14:05:09". */
export function clockTime(ms: number): string {
	return new Date(ms).toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', second: '2-digit' });
}

/** A file-name-safe slug of a title. */
export function slug(title: string): string {
	return (
		title
			.normalize('NFKD')
			.replace(/[\u0300-\u036f]/g, '')
			.toLowerCase()
			.replace(/[^a-z0-9]+/g, '-')
			.replace(/^-+|-+$/g, '')
			.slice(0, 60) || 'plan'
	);
}

/** "1 reagent", "3 reagents". */
export function plural(n: number, word: string, many = `${word}s`): string {
	return `${n} ${n === 1 ? word : many}`;
}

/** "a, b and c". */
export function listText(items: string[]): string {
	if (items.length <= 1) return items.join('');
	return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}
