/// <reference lib="webworker" />
/**
 * The figures of a process's studies computed away from the page (domain/study-capability.ts figuresOrReason):
 * a month of raw values runs the full analysis — a model search with its goodness-of-fit tests, and a control
 * chart — and the process page shows every month of every characteristic, which on a slow machine held the
 * page for a third of a second and more. The worker lives as long as the page; nothing is read or written here.
 */
import type { Characteristic } from '../domain/characteristic';
import type { Study } from '../domain/study';
import { figuresOrReason } from '../domain/study-capability';
import type { CapabilityResult } from '../stats/capability-result';

export interface StudyFiguresRequest {
  id: number;
  /** Each study with its characteristic and the key the page knows the answer by. */
  items: { key: string; study: Study; characteristic: Characteristic }[];
}

export type StudyFiguresMessage =
  | { id: number; type: 'done'; figures: [key: string, figures: CapabilityResult | string][] }
  | { id: number; type: 'error'; message: string };

const scope = self as unknown as DedicatedWorkerGlobalScope;

scope.onmessage = (event: MessageEvent<StudyFiguresRequest>) => {
  const { id, items } = event.data;
  try {
    const figures = items.map(
      ({ key, study, characteristic }) =>
        [key, figuresOrReason(study, characteristic)] as [string, CapabilityResult | string]
    );
    scope.postMessage({ id, type: 'done', figures } satisfies StudyFiguresMessage);
  } catch (error) {
    scope.postMessage({
      id,
      type: 'error',
      message: error instanceof Error ? error.message : String(error)
    } satisfies StudyFiguresMessage);
  }
};
