import adapter from '@sveltejs/adapter-static';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/**
 * Static build: every route without parameters is prerendered as a shell, and
 * `200.html` is the SPA fallback for parameterised routes (a process page).
 * The service worker serves that same fallback for navigations while offline.
 */
/** @type {import('@sveltejs/kit').Config} */
const config = {
  preprocess: vitePreprocess(),
  compilerOptions: { runes: true },
  kit: {
    adapter: adapter({ pages: 'build', assets: 'build', fallback: '200.html', strict: true }),
    alias: { $seed: 'seed-data' },
    // Keep version polling off: the service worker decides when an update is offered.
    version: { pollInterval: 0 },
    typescript: {
      // The seed generator and the test folders are type-checked with the app.
      config: (tsconfig) => {
        tsconfig.include.push('../seed-data/**/*.ts', '../tests/**/*.ts');
      }
    }
  }
};

export default config;
