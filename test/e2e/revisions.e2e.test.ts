/**
 * Two tabs editing one plan never overwrite each other; revisions are saved, listed after a
 * reload, and can be brought back into the working copy. Runs against the built app.
 */
import { describe, expect, it } from 'vitest';
import { createFromTemplate, useApp, waitSaved } from './harness';

const app = useApp();

describe('two tabs on one plan', () => {
	it('the later writer is told, nothing is overwritten, and its version can be kept as a copy', async () => {
		const tabA = await app.newPage('/');
		const id = await createFromTemplate(tabA, 'demo');
		const tabB = await app.newPage(`/plan/${id}`);
		await tabB.getByTestId('notebook-title').waitFor();

		await tabA.getByTestId('plan-notes').fill('Notes written in tab A.');
		await waitSaved(tabA);
		await tabB.getByTestId('plan-notes').fill('Notes written in tab B.');
		const banner = tabB.getByRole('alert').filter({ hasText: 'changed in another tab or window' });
		await banner.waitFor();
		expect(await tabB.getByTestId('save-state').textContent()).toBe('Not saved: changed elsewhere');

		// Tab A's text is what is stored.
		await tabA.reload();
		expect(await tabA.getByTestId('plan-notes').inputValue()).toBe('Notes written in tab A.');

		await banner.getByRole('button', { name: 'Save my version as a new plan' }).click();
		await tabB.waitForURL((url) => /\/plan\/[a-z2-9]{12}$/.test(url.pathname) && !url.pathname.endsWith(id));
		await tabB.getByTestId('notebook-title').filter({ hasText: "(this tab's version)" }).waitFor();
		expect(await tabB.getByTestId('plan-notes').inputValue()).toBe('Notes written in tab B.');
		await tabA.close();
		await tabB.close();
	});
});

describe('revisions', () => {
	it('saves revisions, keeps them across a reload, and restores one with undo', async () => {
		const page = await app.newPage('/');
		await createFromTemplate(page, 'demo');
		await page.getByTestId('budget-total').fill('12000');
		await page.getByTestId('revision-label').fill('before ordering');
		await page.getByRole('button', { name: 'Save revision', exact: true }).click();
		await page.getByTestId('revision-1').waitFor();
		await page.getByTestId('budget-total').fill('9000');
		await waitSaved(page);

		await page.reload();
		await page.getByTestId('revision-1').waitFor();
		expect(await page.getByTestId('revision-1').textContent()).toContain('before ordering');
		expect(await page.getByTestId('budget-total').inputValue()).toBe('9000');

		await page.getByTestId('revision-1').getByRole('button', { name: /^Use as working copy/ }).click();
		expect(await page.getByTestId('budget-total').inputValue()).toBe('12000');
		await page.getByTestId('toast-action').filter({ hasText: 'Undo' }).click();
		expect(await page.getByTestId('budget-total').inputValue()).toBe('9000');
		await waitSaved(page);
		expect(app.errors).toEqual([]);
		await page.close();
	});
});
