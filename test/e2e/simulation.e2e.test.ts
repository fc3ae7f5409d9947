/**
 * The Simulation section in real Chromium against the built app (run `npx vite build` first):
 * a run goes to an engine worker with a moving progress bar, one run is cancelled, another
 * finishes; its numbers equal the engine called directly in Node with the same plan, seed and
 * replicates; the assurance interval is the Wilson score interval; the result is stored with
 * the plan (and a revision), survives a reload, and is marked stale after an input changes.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import pkg from 'jstat';
import { effectiveDesign, parsePlan } from '../../src/lib/core/plan';
import { simulate } from '../../src/lib/core/simulate';
import { createFromTemplate, textOf, useApp, waitSaved, waitVerdicts } from './harness';

const { jStat } = pkg;

const app = useApp();

const progressValue = (page: Page) => page.getByTestId('sim-progress').evaluate((el) => (el as HTMLProgressElement).value);

/**
 * Wilson score interval (Wilson 1927, "Probable inference, the law of succession, and
 * statistical inference", JASA 22:209–212): centre (p̂ + z²/2n) / (1 + z²/n), half-width
 * z·√(p̂(1−p̂)/n + z²/4n²) / (1 + z²/n), with z the 97.5 % normal quantile from jStat.
 */
function wilsonReference(successes: number, n: number): { lo: number; hi: number } {
	const z = jStat.normal.inv(0.975, 0, 1);
	const p = successes / n;
	const denom = 1 + (z * z) / n;
	const centre = (p + (z * z) / (2 * n)) / denom;
	const half = (z * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n))) / denom;
	return { lo: Math.max(0, centre - half), hi: Math.min(1, centre + half) };
}

describe('simulation section', () => {
	it('runs in a worker with progress, cancels one run, finishes another, stores it and finds it after a reload', async () => {
		const page = await app.newPage('/');
		const id = await createFromTemplate(page, 'demo');
		await waitVerdicts(page);
		expect(await textOf(page, 'sim-status')).toBe('No simulation yet.');

		// A long run: the progress bar appears and moves; then it is cancelled.
		await page.getByTestId('sim-reps').fill('5000');
		await page.getByTestId('sim-run').click();
		await page.getByTestId('sim-progress').waitFor();
		await page.waitForFunction(() => ((document.querySelector('[data-testid="sim-progress"]') as HTMLProgressElement | null)?.value ?? 0) > 0, null, { timeout: 30_000 });
		const early = await progressValue(page);
		await page.waitForFunction((v) => ((document.querySelector('[data-testid="sim-progress"]') as HTMLProgressElement | null)?.value ?? 0) > v, early, { timeout: 30_000 });
		expect(await page.getByTestId('sim-progress').evaluate((el) => (el as HTMLProgressElement).max)).toBe(5000);
		expect(await textOf(page, 'sim-progress-text')).toMatch(/^[\d,]+ of 5,000 replicates$/);
		expect(await page.getByTestId('sim-run').isDisabled()).toBe(true);
		await page.getByTestId('sim-cancel').click();
		await page.getByTestId('sim-progress').waitFor({ state: 'detached' });
		expect(await textOf(page, 'sim-status')).toBe('Cancelled. Nothing was stored.');
		expect(await page.getByTestId('sim-result').count()).toBe(0);

		// A run that finishes, with its own seed.
		await page.getByTestId('sim-reps').fill('200');
		await page.getByTestId('sim-seed').fill('7');
		await page.getByTestId('sim-run').click();
		await page.getByTestId('sim-result').waitFor({ timeout: 90_000 });
		const meta = await textOf(page, 'sim-meta');
		expect(meta).toMatch(/^Seed 7 · 200 replicates · route targeted · estimator Support-pattern unmixing \(known targets\) \(chosen by the route\)/);

		// The worker's numbers equal the engine called directly (same plan, seed and replicates).
		const plan = parsePlan(readFileSync('templates/demo.json', 'utf8'));
		const direct = simulate(plan, effectiveDesign(plan), { seed: 7, reps: 200 });
		expect(await textOf(page, 'sim-mcc-mean')).toBe(direct.mcc.mean.toFixed(3));
		expect(await textOf(page, 'sim-mcc-p10')).toBe(direct.mcc.p10.toFixed(3));
		expect(await textOf(page, 'sim-mcc-median')).toBe(direct.mcc.median.toFixed(3));
		expect(await textOf(page, 'sim-mcc-p90')).toBe(direct.mcc.p90.toFixed(3));

		// Assurance = share of replicates with MCC ≥ goal, with the Wilson 95 % interval.
		const successes = direct.mccs.filter((m) => m >= plan.goal.mcc).length;
		const reference = wilsonReference(successes, 200);
		const assurance = await textOf(page, 'sim-assurance');
		expect(assurance).toContain(`Assurance ${((100 * successes) / 200).toFixed(1)} %`);
		expect(assurance).toContain(`${successes} of 200 replicates reach MCC ≥ 0.9`);
		expect(await textOf(page, 'sim-assurance-interval')).toBe(`${(100 * reference.lo).toFixed(1)} %–${(100 * reference.hi).toFixed(1)} %`);
		// With 80 % as the goal and the demo's default design, the interval lies below the goal.
		expect(reference.hi).toBeLessThan(plan.goal.assurance);
		expect(assurance).toContain('falls short of the assurance goal of 80 %');

		// Charts carry their numbers for screen readers: the histogram's bins hold all 200 replicates,
		// the factor chart names each factor with its mean correlation.
		const binCounts = await page
			.getByTestId('sim-histogram')
			.locator('tbody tr td')
			.allTextContents()
			.then((cells) => cells.map(Number));
		expect(binCounts.reduce((s, c) => s + c, 0)).toBe(200);
		expect(await page.getByTestId('sim-histogram').locator('[role="img"]').getAttribute('aria-label')).toContain(`median ${direct.mcc.median.toFixed(3)}`);
		const factorLabel = (await page.getByTestId('sim-factors').locator('[role="img"]').getAttribute('aria-label')) ?? '';
		for (const f of direct.factors) expect(factorLabel).toContain(`${plan.factors.find((x) => x.id === f.id)!.name} ${f.meanCorr.toFixed(3)}`);
		expect(await page.getByTestId('sim-histogram').locator('canvas').boundingBox()).not.toBeNull();

		// Stored with a revision.
		await page.getByTestId('sim-save-revision').click();
		await page.getByTestId('revision-1').filter({ hasText: 'Simulation: seed 7, 200 replicates' }).waitFor();
		await waitSaved(page);

		// After a reload the stored result is back, current, with its settings.
		await page.reload();
		await page.getByTestId('sim-result').waitFor();
		expect(new URL(page.url()).pathname).toBe(`/plan/${id}`);
		expect(await textOf(page, 'sim-mcc-median')).toBe(direct.mcc.median.toFixed(3));
		expect(await textOf(page, 'sim-meta')).toMatch(/^Seed 7 · 200 replicates/);
		expect(await page.getByTestId('sim-seed').inputValue()).toBe('7');
		expect(await page.getByTestId('sim-reps').inputValue()).toBe('200');
		expect(await page.getByTestId('sim-stale').count()).toBe(0);

		// Changing an input marks the result stale (kept, not passed off as current), also after a reload.
		await page.getByTestId('replicate-noise').fill('0.6');
		await page.getByTestId('sim-stale').waitFor();
		expect(await textOf(page, 'sim-stale')).toMatch(/^Stale\. The plan’s inputs have changed since this run/);
		await waitSaved(page);
		await page.reload();
		await page.getByTestId('sim-stale').waitFor();
		expect(await textOf(page, 'sim-mcc-median')).toBe(direct.mcc.median.toFixed(3));
		expect(app.errors).toEqual([]);
		await page.close();
	});

	it('runs an estimator chosen in the settings and shows the engine’s warnings about it', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		await waitVerdicts(page);
		// The demo has one baseline environment, so joint diagonalisation (a contexts-route estimator)
		// has nothing to work with: the run still finishes, and says so.
		await page.getByTestId('sim-estimator').selectOption('jointdiag');
		await page.getByTestId('sim-reps').fill('20');
		await page.getByTestId('sim-run').click();
		await page.getByTestId('sim-result').waitFor({ timeout: 60_000 });
		expect(await textOf(page, 'sim-meta')).toMatch(/^Seed 1 · 20 replicates · route targeted · estimator Joint diagonalisation \(contexts\) \(chosen in the settings\)/);
		const warnings = await textOf(page, 'sim-warnings');
		expect(warnings).toContain('joint diagonalisation needs at least 2 contexts');
		expect(warnings).toMatch(/only one context has data: joint diagonalisation cannot separate the factors \(in 20 of 20 replicates\)/);
		expect(app.errors).toEqual([]);
		await page.close();
	});
});
