// Process ids exist only in the browser's database: this page is served by the SPA fallback.
export const prerender = false;
export const ssr = false;
