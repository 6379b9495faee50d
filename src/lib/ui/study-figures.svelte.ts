import { SvelteMap } from 'svelte/reactivity';
import type { Characteristic } from '../domain/characteristic';
import type { Study } from '../domain/study';
import type { CapabilityResult } from '../stats/capability-result';
import type { StudyFiguresRequest } from '../workers/study-figures.worker';
import type { WorkerService } from './worker-service';
import { studyFiguresWorker, type StudyFiguresAnswer } from './study-figures-client';

/** Studies sent to the worker in one request: the first characteristic's months come back while the rest run. */
const PER_REQUEST = 24;

/**
 * The figures of the studies a page shows, computed in a background worker (workers/study-figures.worker.ts)
 * and kept per study and characteristic revision. `of` answers at once with what is known — undefined while a
 * study's figures are being computed — and asks the worker for the rest; the page draws again as they arrive
 * (the map is reactive). Studies asked for in one drawing go in one batch. `close` ends the worker with the page.
 */
export class StudyFigures {
  readonly #known = new SvelteMap<string, CapabilityResult | string>();
  // Which keys were asked for: bookkeeping read and written while the page draws, never drawn from itself.
  // eslint-disable-next-line svelte/prefer-svelte-reactivity
  readonly #asked = new Set<string>();
  #waiting: StudyFiguresRequest['items'] = [];
  #service: WorkerService<Omit<StudyFiguresRequest, 'id'>, StudyFiguresAnswer> | undefined;

  /** The study's figures or why there are none; undefined while they are being computed. */
  of(study: Study, characteristic: Characteristic): CapabilityResult | string | undefined {
    const key = `${study.id}@${study.rev}@${characteristic.rev}`;
    const known = this.#known.get(key);
    if (known !== undefined || this.#asked.has(key)) return known;
    this.#asked.add(key);
    // Sent as they are: the page holds its records as raw state (never Svelte's proxies), the worker receives a
    // copy made when the batch is sent in this turn, and a later revision is another key. A deep snapshot here
    // cost a third of the page's first drawing on a process of raw values: Svelte's snapshot copies each number
    // of a study's values through structuredClone, one call each.
    this.#waiting.push({ key, study, characteristic });
    if (this.#waiting.length === 1) queueMicrotask(() => this.#send());
    return undefined;
  }

  close(): void {
    this.#service?.close();
    this.#service = undefined;
  }

  #send(): void {
    const items = this.#waiting;
    this.#waiting = [];
    this.#service ??= studyFiguresWorker();
    for (let at = 0; at < items.length; at += PER_REQUEST) {
      const part = items.slice(at, at + PER_REQUEST);
      this.#service.ask({ items: part }).then(
        (answer) => {
          for (const [key, figures] of answer.figures) this.#known.set(key, figures);
        },
        (error: unknown) => {
          // Said where the figures would be, month by month; a page opened again asks again.
          const reason = error instanceof Error ? error.message : String(error);
          for (const { key } of part) this.#known.set(key, reason);
        }
      );
    }
  }
}
