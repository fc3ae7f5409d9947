/**
 * Browser-test harness: serves the built app (`build/`, made by `npx vite build`) on a free
 * port and drives Debian's Chromium through playwright-core with a fresh profile, so every
 * test file starts with an empty IndexedDB. Reused by every `*.e2e.test.ts`:
 *
 *   const app = useApp();                   // server + browser, opened before and closed after the file's tests
 *   const page = await app.newPage('/');    // (inside a test) a tab at the given path, errors collected
 *
 * `openApp()` opens one by hand; the caller then closes it with `app.close()`.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Server } from 'node:http';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { createServer, listen } from '../../scripts/serve.mjs';

/** Debian's Chromium; the wrapper script at /usr/bin/chromium also works but prints a shell warning. */
const CHROMIUM = existsSync('/usr/lib/chromium/chromium') ? '/usr/lib/chromium/chromium' : '/usr/bin/chromium';
const ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

export interface App {
	/** Base URL of the served app, e.g. http://127.0.0.1:41234 */
	url: string;
	context: BrowserContext;
	/** Opens a tab at `pathname`; page errors and console errors are collected in `errors`. */
	newPage(pathname?: string): Promise<Page>;
	/** Uncaught page errors and console errors seen so far (a test can assert it is empty). */
	errors: string[];
	/** Closes the browser, stops the server and deletes the profile. */
	close(): Promise<void>;
}

export interface OpenAppOptions {
	/** Window size; default 1280 × 900 (a laptop screen). */
	viewport?: { width: number; height: number };
	/** Directory to serve; default `build/`. */
	dir?: string;
}

/** Starts the server and the browser. Throws a clear message when the app was not built. */
export async function openApp(options: OpenAppOptions = {}): Promise<App> {
	const dir = options.dir ?? path.resolve('build');
	if (!existsSync(path.join(dir, 'index.html'))) throw new Error(`${dir}/index.html is missing: run "npx vite build" before the browser tests`);
	const server: Server = createServer(dir);
	const port: number = await listen(server, 0);
	const url = `http://127.0.0.1:${port}`;
	const profile = mkdtempSync(path.join(tmpdir(), 'identiplate-e2e-'));
	const context = await chromium.launchPersistentContext(profile, {
		executablePath: CHROMIUM,
		headless: true,
		args: ARGS,
		viewport: options.viewport ?? { width: 1280, height: 900 },
		acceptDownloads: true,
		baseURL: url
	});
	const errors: string[] = [];
	const watch = (page: Page) => {
		page.on('pageerror', (err) => errors.push(`pageerror: ${err.message}`));
		page.on('console', (msg) => {
			if (msg.type() === 'error') errors.push(`console: ${msg.text()}`);
		});
	};
	context.pages().forEach(watch);
	context.on('page', watch);
	return {
		url,
		context,
		errors,
		async newPage(pathname = '/') {
			const page = await context.newPage();
			await page.goto(url + pathname);
			return page;
		},
		async close() {
			await context.close();
			await new Promise<void>((resolve) => server.close(() => resolve()));
			rmSync(profile, { recursive: true, force: true });
		}
	};
}

/**
 * Opens the app before the calling file's tests and closes it after them. The returned object
 * stands for the open app; use it inside tests (before they run the app is not open yet).
 */
export function useApp(options: OpenAppOptions = {}): App {
	let opened: App | undefined;
	beforeAll(async () => {
		opened = await openApp(options);
	});
	afterAll(async () => {
		await opened?.close();
	});
	const current = (): App => {
		if (!opened) throw new Error('the app is not open yet: use it inside a test');
		return opened;
	};
	return {
		get url() {
			return current().url;
		},
		get context() {
			return current().context;
		},
		get errors() {
			return current().errors;
		},
		newPage: (pathname) => current().newPage(pathname),
		close: () => current().close()
	};
}

/** Clicks something that starts a download and returns the file's suggested name and its text. */
export async function downloadFile(page: Page, click: () => Promise<void>): Promise<{ name: string; text: string }> {
	const [file] = await Promise.all([page.waitForEvent('download'), click()]);
	return { name: file.suggestedFilename(), text: readFileSync((await file.path())!, 'utf8') };
}

/** Text content of the element with `testid`, runs of white space collapsed (as the page shows it). */
export async function textOf(page: Page, testid: string): Promise<string> {
	return ((await page.getByTestId(testid).textContent()) ?? '').replace(/\s+/g, ' ').trim();
}

/** Rendered text (innerText: white space between table cells) of the first element with `testid`, white space collapsed. */
export async function renderedText(page: Page, testid: string): Promise<string> {
	return (await page.getByTestId(testid).first().innerText()).replace(/\s+/g, ' ').trim();
}

/** Waits until the notebook says everything is saved (autosave finished). */
export async function waitSaved(page: Page): Promise<void> {
	await page.getByTestId('save-state').filter({ hasText: /^Saved/ }).waitFor();
}

/** Waits until the verdicts belong to the plan as it is now (not "Updating…"). */
export async function waitVerdicts(page: Page): Promise<void> {
	await page.getByTestId('verdict-status').filter({ hasNotText: /Updating/ }).waitFor();
}

/** Creates a plan from the template `key` on the plans list and waits for its notebook. */
export async function createFromTemplate(page: Page, key: string): Promise<string> {
	await page.goto('/');
	await page.getByTestId(`template-${key}`).click();
	await page.waitForURL(/\/plan\/[a-z2-9]{12}$/);
	await page.getByTestId('notebook-title').waitFor();
	return new URL(page.url()).pathname.split('/').pop()!;
}
