import { sveltekit } from '@sveltejs/kit/vite';
import { SvelteKitPWA } from '@vite-pwa/sveltekit';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import { chartCompileHint } from './src/build/chart-compile-hint';
import { prebuiltParsers } from './src/build/prebuilt-parsers';

const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as {
  version: string;
};

export default defineConfig({
  // CAPSTAN_VERSION lets the service-worker update test build a "next version" of the same code.
  define: { __APP_VERSION__: JSON.stringify(process.env.CAPSTAN_VERSION ?? pkg.version) },
  resolve: {
    // Every `import … from 'zod'` gets zod set not to try eval (see src/build/zod-without-eval.ts).
    alias: [
      {
        find: /^zod$/,
        replacement: fileURLToPath(new URL('./src/build/zod-without-eval.ts', import.meta.url))
      }
    ]
  },
  // Workers are ES modules so that they can import the same code the page uses.
  // Workers are bundled apart, with plugins of their own: the exchange worker imports the prebuilt parsers.
  worker: { format: 'es', plugins: () => [prebuiltParsers()] },
  plugins: [
    sveltekit(),
    chartCompileHint(),
    prebuiltParsers(),
    SvelteKitPWA({
      // base and scope fixed at the root: deep links must not register the worker at their own path.
      base: '/',
      scope: '/',
      registerType: 'prompt',
      injectRegister: false,
      kit: { adapterFallback: '200.html', spa: true },
      manifest: {
        name: 'Capstan — process-capability portfolio',
        short_name: 'Capstan',
        description:
          'Offline-first portfolio of process-capability studies across sites: yield, ppm and z-level on one scale.',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        background_color: '#f6f4ef',
        theme_color: '#1f3a4d',
        icons: [
          { src: '/icons/capstan-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/capstan-512.png', sizes: '512x512', type: 'image/png' },
          {
            src: '/icons/capstan-maskable-512.png',
            sizes: '512x512',
            type: 'image/png',
            purpose: 'maskable'
          }
        ]
      },
      workbox: {
        // The whole app is precached, the demo portfolio chunk included, so a first visit is enough to work offline.
        globPatterns: ['client/**/*.{js,css,ico,png,svg,webmanifest,json}', 'prerendered/**/*.{html,json}'],
        maximumFileSizeToCacheInBytes: 4 * 1024 * 1024,
        cleanupOutdatedCaches: true,
        // The first worker takes charge of the open page at once (nothing older to replace). Later versions
        // still wait for the person to accept the update prompt: no skipWaiting here.
        clientsClaim: true
      },
      devOptions: { enabled: false }
    })
  ],
  test: {
    include: ['src/**/*.spec.ts', 'seed-data/**/*.spec.ts', 'tests/unit/**/*.spec.ts'],
    environment: 'node',
    expect: { requireAssertions: true }
  }
});
