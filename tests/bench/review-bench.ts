/**
 * The quarterly review of 2 000 processes × 36 months (generated as in the ranking benchmark, with a project on
 * every tenth process, a fifth of them in Control): the figures of a quarter — eight quarterly rankings for the
 * trend, movers with their tests, sites, pipeline, assumptions — computed from nothing, then again with the
 * window figures cached (what a note or a freeze costs). Prints only.
 */
import { BUILT_IN_PROFILES } from '../../src/lib/domain/context-profile';
import { PROJECT_PHASES } from '../../src/lib/domain/improvement-project';
import type { FiguresCache } from '../../src/lib/domain/portfolio-ranking';
import { buildQuarterReview } from '../../src/lib/domain/quarter-review';
import type { BenchRow } from './engine-bench';
import { generatePortfolio } from './ranking-bench';

export function runReviewBench(): BenchRow[] {
  const records = generatePortfolio(2000, 36);
  const projects = records.processes
    .filter((_, i) => i % 10 === 0)
    .map((p, i) => ({
      id: `project-${i}`,
      createdAt: '',
      updatedAt: '',
      rev: 1,
      deviceId: 'bench',
      processId: p.id,
      title: `Project ${i}`,
      phase: PROJECT_PHASES[i % PROJECT_PHASES.length]!,
      owner: '',
      startDate: '2025-04-01',
      expectedAnnualSaving: 10_000
    }));
  const withProjects = { ...records, projects };
  const cache: FiguresCache = new Map();
  let t = performance.now();
  const figures = buildQuarterReview(withProjects, BUILT_IN_PROFILES, { quarter: '2026-Q4', cache });
  const first = performance.now() - t;
  t = performance.now();
  buildQuarterReview(withProjects, BUILT_IN_PROFILES, { quarter: '2026-Q4', cache });
  const again = performance.now() - t;
  return [
    {
      name: `quarterly review, 2 000 processes × 36 months (${figures.shareTrend.length} quarters ranked, ${figures.control.length} control projects): first computation`,
      ms: first,
      target: 'page shows it within a few seconds'
    },
    { name: '  … again with window figures cached', ms: again }
  ];
}
