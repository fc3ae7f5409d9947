// Client-only single-page app: no server rendering, no prerendered pages.
export const ssr = false;
export const prerender = false;
