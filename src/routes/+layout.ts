// Every route without parameters is prerendered as a shell; data come from IndexedDB in the browser.
export const prerender = true;
export const trailingSlash = 'never';
