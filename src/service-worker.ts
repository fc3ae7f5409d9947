/// <reference types="@sveltejs/kit" />
/// <reference no-default-lib="true"/>
/// <reference lib="esnext" />
/// <reference lib="webworker" />
/**
 * Offline support: caches the built app (scripts, styles, the engine worker, static files and
 * the app page) when installed, and answers from that cache when the network is unavailable.
 * Plans live in IndexedDB, so once loaded the whole notebook works offline.
 */
import { build, files, version } from '$service-worker';

const sw = self as unknown as ServiceWorkerGlobalScope;
const CACHE = `identiplate-${version}`;
/** The single page every client route is served by (adapter-static fallback). */
const APP_PAGE = '/';
const ASSETS = new Set([...build, ...files, APP_PAGE]);

sw.addEventListener('install', (event) => {
	event.waitUntil(
		caches
			.open(CACHE)
			.then((cache) => cache.addAll([...ASSETS]))
			.then(() => sw.skipWaiting())
	);
});

sw.addEventListener('activate', (event) => {
	event.waitUntil(
		caches
			.keys()
			.then((keys) => Promise.all(keys.filter((key) => key !== CACHE).map((key) => caches.delete(key))))
			.then(() => sw.clients.claim())
	);
});

sw.addEventListener('fetch', (event) => {
	const request = event.request;
	if (request.method !== 'GET') return;
	const url = new URL(request.url);
	if (url.origin !== sw.location.origin) return;

	event.respondWith(
		(async () => {
			const cache = await caches.open(CACHE);
			// Built assets never change under the same version: cache first.
			if (ASSETS.has(url.pathname) && url.pathname !== APP_PAGE) {
				const hit = await cache.match(url.pathname);
				if (hit) return hit;
			}
			try {
				const response = await fetch(request);
				if (response.ok && request.mode === 'navigate') await cache.put(APP_PAGE, response.clone());
				return response;
			} catch (err) {
				// Offline: any page of the app is the app page; assets from the cache.
				const fallback = request.mode === 'navigate' ? await cache.match(APP_PAGE) : await cache.match(url.pathname);
				if (fallback) return fallback;
				throw err;
			}
		})()
	);
});
