/**
 * The Sizing section in real Chromium against the built app (run `npx vite build` first):
 * sizing the demo plan in an engine worker with a moving progress count and a working cancel;
 * the recommended design, its cost and the t-test table equal the engine called directly in
 * Node (same plan and seed); "adopt" writes the design into the plan and saves a revision; after
 * a reload the Design section shows the adopted design; changing an input marks the sizing stale.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { parsePlan } from '../../src/lib/core/plan';
import { sizePlanSync } from '../../src/lib/core/size';
import { createFromTemplate, textOf, useApp, waitSaved, waitVerdicts } from './harness';

const app = useApp();

const replicatesDone = async (page: Page) => Number((await textOf(page, 'size-progress-count')).replace(/,/g, ''));
/** The notebook's money text ("1,372 EUR"), as format.ts writes it. */
const eur = (x: number) => `${x.toLocaleString('en-GB', { maximumFractionDigits: 2, minimumFractionDigits: x % 1 === 0 ? 0 : 2 })} EUR`;

/** Checks the Design section shows `design` as the plan's fixed design. */
async function expectDesignSection(page: Page, design: { reagents: string[]; replicates: number }, allReagents: string[]) {
	expect(await page.getByTestId('design-fixed').isChecked()).toBe(true);
	expect(await page.getByTestId('design-replicates').inputValue()).toBe(String(design.replicates));
	for (const id of allReagents) expect(await page.getByTestId(`design-reagent-${id}`).isChecked(), id).toBe(design.reagents.includes(id));
}

describe('sizing section', () => {
	it('sizes the demo plan with progress and cancel, adopts the design, and finds it in place after a reload', { timeout: 600_000 }, async () => {
		const page = await app.newPage('/');
		const id = await createFromTemplate(page, 'demo');
		await waitVerdicts(page);
		expect(await textOf(page, 'size-status')).toBe('Not sized yet.');

		// First run: the count of simulated replicates moves; then cancel.
		await page.getByTestId('size-run').click();
		await page.getByTestId('size-progress').waitFor();
		await page.getByTestId('size-progress-count').waitFor({ timeout: 60_000 });
		const early = await replicatesDone(page);
		await page.waitForFunction(
			(v) => Number((document.querySelector('[data-testid="size-progress-count"]')?.textContent ?? '0').replace(/,/g, '')) > v,
			early,
			{ timeout: 60_000 }
		);
		expect(await textOf(page, 'size-progress-text')).toMatch(/^Searching for the fewest replicates · [\d,]+ replicates simulated so far · judging \d+ reagents, \d+ replicates, \d+ controls per plate$/);
		await page.getByTestId('size-cancel').click();
		await page.getByTestId('size-progress').waitFor({ state: 'detached' });
		expect(await textOf(page, 'size-status')).toBe('Cancelled. Nothing was stored.');
		expect(await page.getByTestId('size-result').count()).toBe(0);

		// Second run to the end.
		await page.getByTestId('size-run').click();
		await page.getByTestId('size-result').waitFor({ timeout: 400_000 });

		// The same sizing run directly on the engine (same plan, default seed 1).
		const plan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
		const direct = sizePlanSync(plan, { seed: 1 });
		expect(direct.feasible).toBe(true);
		const d = direct.design!;
		const name = (rid: string) => plan.reagents.find((r) => r.id === rid)!.name;

		expect(await textOf(page, 'size-verdict')).toBe(`Feasible. ${direct.reason}`);
		expect(await textOf(page, 'size-design-reagents')).toBe(`${d.reagents.length} reagents: ${d.reagents.map(name).join(', ')}`);
		expect(await textOf(page, 'size-design-replicates')).toBe(`${d.replicates} wells per reagent and context`);
		expect(await textOf(page, 'size-design-plates')).toMatch(new RegExp(`^${d.plates} × 384-well`));
		expect(await textOf(page, 'size-cost-total')).toBe(`${eur(d.cost)} of ${eur(plan.budget.total)}`);
		const a = direct.assurance!;
		expect(await textOf(page, 'size-design-assurance')).toBe(
			`${(100 * a.p).toFixed(1)} % (Wilson 95 % interval ${(100 * a.lo).toFixed(1)} %–${(100 * a.hi).toFixed(1)} %, ${a.reps} replicates) that MCC ≥ 0.9; goal 80 %`
		);
		// The cost breakdown adds up: plates + reagents + fixed = total (cost model of DESIGN.md).
		const c = direct.cost!;
		expect(c.plateCost + c.reagentCost + c.fixedCost).toBeCloseTo(c.total, 9);
		// The t-test table shows the engine's wells per group for every reagent of the design.
		for (const t of direct.tTest) expect(await textOf(page, `size-ttest-${t.id}`)).toContain(String(t.replicatesNeeded ?? '—'));
		// The charts carry their numbers: the frontier summary names its end points, the curve its points.
		const frontierLabel = (await page.getByTestId('size-frontier').locator('[role="img"]').getAttribute('aria-label')) ?? '';
		expect(frontierLabel).toContain(`Frontier of ${direct.frontier.length} designs`);
		expect(frontierLabel).toContain(`The recommended design costs ${eur(d.cost)}`);
		const curveLabel = (await page.getByTestId('size-curve').locator('[role="img"]').getAttribute('aria-label')) ?? '';
		for (const p of direct.curve) expect(curveLabel).toContain(`${p.replicates} replicates median ${p.median.toFixed(3)}, 10th percentile ${p.p10.toFixed(3)}`);

		// Adopt: the design goes into the plan and a revision is saved.
		await page.getByTestId('size-adopt').click();
		await page.getByTestId('size-adopted').waitFor();
		await page.getByTestId('revision-1').filter({ hasText: 'Adopted sized design' }).waitFor();
		expect(await textOf(page, 'size-adopted')).toContain('adopted, revision 1');
		await page.getByTestId('size-is-plan-design').waitFor();
		expect(await page.getByTestId('size-stale').count()).toBe(0);
		const allReagents = plan.reagents.map((r) => r.id);
		await expectDesignSection(page, d, allReagents);
		await waitSaved(page);

		// After a reload the plan's design is the adopted one and the sizing still describes it.
		await page.reload();
		await page.getByTestId('size-result').waitFor();
		expect(new URL(page.url()).pathname).toBe(`/plan/${id}`);
		await expectDesignSection(page, d, allReagents);
		await page.getByTestId('size-adopted').waitFor();
		expect(await page.getByTestId('size-stale').count()).toBe(0);
		expect(await textOf(page, 'size-design-replicates')).toBe(`${d.replicates} wells per reagent and context`);
		// The Design section's cost agrees with the sizing's cost of the adopted design.
		await page.getByTestId('design-cost').filter({ hasText: eur(d.cost) }).waitFor();

		// Changing an input marks the sizing stale; adopting is no longer offered as current.
		await page.getByTestId('replicate-noise').fill('0.7');
		await page.getByTestId('size-stale').waitFor();
		expect(await textOf(page, 'size-stale')).toMatch(/^Stale\. The plan’s inputs have changed since this sizing/);
		expect(await page.getByTestId('size-adopted').count()).toBe(0);
		expect(app.errors).toEqual([]);
		await page.close();
	});

	it('says plainly when the budget is short: the best design it buys and the budget the goal needs', { timeout: 600_000 }, async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		await waitVerdicts(page);
		await page.getByTestId('budget-total').fill('1200');
		await waitSaved(page);
		await page.getByTestId('size-run').click();
		await page.getByTestId('size-result').waitFor({ timeout: 400_000 });

		const plan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
		plan.budget.total = 1200;
		const direct = sizePlanSync(plan, { seed: 1 });
		expect(direct.feasible).toBe(false);
		expect(direct.budgetNeeded).not.toBeNull();
		const d = direct.design!;
		const name = (rid: string) => plan.reagents.find((r) => r.id === rid)!.name;

		expect(await textOf(page, 'size-verdict')).toBe(`Not feasible within the budget. ${direct.reason}`);
		expect(await textOf(page, 'size-budget-needed')).toMatch(new RegExp(`^The goal needs a budget of ${eur(direct.budgetNeeded!).replace(/[.]/g, '\\.')} \\(the cheapest design found reaching it`));
		expect(await textOf(page, 'size-budget-needed')).toContain('the budget is 1,200 EUR');
		expect(await page.getByTestId('size-design').locator('h3').textContent()).toBe('Best design the budget buys');
		expect(await textOf(page, 'size-design-reagents')).toBe(`${d.reagents.length} reagents: ${d.reagents.map(name).join(', ')}`);
		expect(await textOf(page, 'size-design-replicates')).toBe(`${d.replicates} wells per reagent and context`);
		expect(d.cost).toBeLessThanOrEqual(1200);
		expect(await textOf(page, 'size-cost-total')).toBe(`${eur(d.cost)} of 1,200 EUR`);
		expect(app.errors).toEqual([]);
		await page.close();
	});

	it('says why no design can reach the goal when a factor cannot be separated', { timeout: 600_000 }, async () => {
		// The demo without its two unknown-target reagents, plus a factor no reagent targets: on the
		// targeted route no choice of reagents separates the others from it (per-factor rank condition).
		const plan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
		plan.title = 'Demo with an untargeted factor';
		plan.reagents = plan.reagents.filter((r) => r.targets !== null);
		plan.factors.push({ id: 'mot', name: 'Motility', shape: 'laplace' });
		const page = await app.newPage('/');
		await page.getByTestId('plan-list').waitFor();
		await page.getByTestId('import-file').setInputFiles({ name: 'untargeted.plan.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(plan)) });
		await page.locator('.plan-card.highlight h2 a').click();
		await page.getByTestId('notebook-title').filter({ hasText: 'Demo with an untargeted factor' }).waitFor();
		await waitVerdicts(page);
		await page.getByTestId('size-run').click();
		await page.getByTestId('size-result').waitFor({ timeout: 400_000 });

		const direct = sizePlanSync(plan, { seed: 1 });
		expect(direct.feasible).toBe(false);
		expect(direct.budgetNeeded).toBeNull();
		// Every reagent avoids Motility, so Motility itself passes the rank condition; each other
		// factor has no reagent-free direction left and is recoverable only together with Motility.
		expect(direct.unreachable.length).toBeGreaterThan(0);
		expect(direct.unreachable.every((u) => u.block.includes('mot'))).toBe(true);
		expect(await textOf(page, 'size-verdict')).toBe(`No design can reach the goal. ${direct.reason}`);
		expect(await page.getByTestId('size-budget-needed').count()).toBe(0);
		const lines = (await page.getByTestId('size-unreachable').locator('li').allTextContents()).map((l) => l.replace(/\s+/g, ' ').trim());
		expect(lines).toHaveLength(direct.unreachable.length);
		direct.unreachable.forEach((u, i) => {
			expect(lines[i]).toMatch(new RegExp(`^${plan.factors.find((f) => f.id === u.id)!.name} \\(only together with [^)]*Motility[^)]*\\): `));
			expect(lines[i]).toContain(u.reason);
		});
		expect(app.errors).toEqual([]);
		await page.close();
	});
});
