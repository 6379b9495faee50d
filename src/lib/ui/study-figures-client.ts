import type { StudyFiguresMessage, StudyFiguresRequest } from '../workers/study-figures.worker';
import { workerService, type WorkerService } from './worker-service';

export type StudyFiguresAnswer = Extract<StudyFiguresMessage, { type: 'done' }>;

/** The process page's worker for its studies' figures (workers/study-figures.worker.ts), kept for the visit. */
export function studyFiguresWorker(): WorkerService<Omit<StudyFiguresRequest, 'id'>, StudyFiguresAnswer> {
  return workerService(
    () => new Worker(new URL('../workers/study-figures.worker.ts', import.meta.url), { type: 'module' }),
    'The figures could not be computed'
  );
}
