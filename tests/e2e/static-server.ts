import type { Page } from '@playwright/test';
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const SERVER = fileURLToPath(new URL('../../src/build/serve-static.mjs', import.meta.url));
const BUILD = fileURLToPath(new URL('../../build', import.meta.url));

export interface RunningServer {
  url: string;
  stop(): Promise<void>;
}

/**
 * Starts the project's static server on a free port for one test, so that a test can stop it and
 * prove the app keeps working with no server at all.
 */
export async function startStaticServer(dir: string = BUILD): Promise<RunningServer> {
  const child: ChildProcess = spawn(process.execPath, [SERVER, dir, '--port', '0'], {
    stdio: ['ignore', 'pipe', 'pipe']
  });
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('static server did not start within 10 s')), 10_000);
    child.stdout?.on('data', (chunk: Buffer) => {
      const match = /running at (http:\/\/\S+?)\/? /.exec(chunk.toString());
      if (match?.[1]) {
        clearTimeout(timer);
        resolve(match[1]);
      }
    });
    child.on('exit', (code) => reject(new Error(`static server exited with ${code}`)));
  });
  return {
    url,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      })
  };
}

/** Waits until the service worker has installed (precached the app) and controls the page. */
export async function waitForServiceWorker(page: Page): Promise<void> {
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
    if (!navigator.serviceWorker.controller) {
      await new Promise((resolve) =>
        navigator.serviceWorker.addEventListener('controllerchange', resolve, { once: true })
      );
    }
  });
}
