/**
 * What `zod` resolves to in the bundled app (an alias in vite.config.ts): zod itself, told before any schema is
 * built not to compile validators with `new Function`. The app's Content-Security-Policy forbids eval, and zod
 * decides whether to try it when each schema is created — so the setting must come before the first schema,
 * whichever module defines it first. The command line runs zod unaliased, with its compiled validators.
 */
import { config } from 'zod/v4';

config({ jitless: true });

export * from 'zod/v4';
