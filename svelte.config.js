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
    // CAPSTAN_BUILD_DIR: where the service-worker update test writes its "next version" build.
    adapter: adapter({
      pages: process.env.CAPSTAN_BUILD_DIR ?? 'build',
      assets: process.env.CAPSTAN_BUILD_DIR ?? 'build',
      fallback: '200.html',
      strict: true
    }),
    alias: { $seed: 'seed-data' },
    // Keep version polling off: the service worker decides when an update is offered.
    version: { pollInterval: 0 },
    // Content-Security-Policy as a meta tag in every page: scripts only from this origin (SvelteKit's one
    // bootstrap script is allowed by its hash, never by 'unsafe-inline'), no remote origin for anything, no eval.
    // Inline style attributes stay allowed: the chart library and Svelte's style: directive set them.
    csp: {
      mode: 'hash',
      directives: {
        'default-src': ['self'],
        'script-src': ['self'],
        'style-src': ['self', 'unsafe-inline'],
        'img-src': ['self', 'data:', 'blob:'],
        'font-src': ['self'],
        'connect-src': ['self'],
        'worker-src': ['self'],
        'manifest-src': ['self'],
        'object-src': ['none'],
        'base-uri': ['self'],
        'form-action': ['self']
      }
    },
    typescript: {
      // The seed generator and the test folders are type-checked with the app.
      config: (tsconfig) => {
        tsconfig.include.push('../seed-data/**/*.ts', '../tests/**/*.ts');
      }
    }
  }
};

export default config;
