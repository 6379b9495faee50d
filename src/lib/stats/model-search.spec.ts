import { describe, expect, it } from 'vitest';
import { SeededRandom } from '../../../seed-data/seeded-random';
import { searchModels } from './model-search';
import { mean, sampleSd } from './moments';
import { sortedCopy } from './quantiles';

/**
 * The model search on data drawn from known families (seeded): the family the data came from is accepted and
 * ranks first or within the accepted group by A², and a family the data plainly are not is refused.
 */
function search(values: number[]) {
  const sorted = sortedCopy(values);
  return searchModels(sorted, mean(sorted), sampleSd(sorted));
}

describe('model search', () => {
  it('accepts the lognormal for lognormal data and refuses the normal', () => {
    const rng = new SeededRandom(5);
    const r = search(Array.from({ length: 2000 }, () => Math.exp(0.6 * rng.normal()) * 3));
    const by = new Map(r.candidates.map((c) => [c.model, c]));
    expect(by.get('lognormal')!.accepted).toBe(true);
    expect(by.get('normal')!.accepted).toBe(false);
    expect(r.best).toBeDefined();
    expect(['lognormal', 'boxcox', 'johnson']).toContain(r.best!.name);
  });

  it('accepts the exponential for exponential data and ranks accepted models by A²', () => {
    const rng = new SeededRandom(9);
    const r = search(Array.from({ length: 1000 }, () => -2 * Math.log(1 - rng.next())));
    expect(r.candidates.find((c) => c.model === 'exponential')!.accepted).toBe(true);
    const accepted = r.candidates.filter((c) => c.accepted);
    for (let i = 1; i < accepted.length; i++)
      expect(accepted[i]!.ad!).toBeGreaterThanOrEqual(accepted[i - 1]!.ad!);
    // Accepted candidates come before refused ones.
    const firstRefused = r.candidates.findIndex((c) => !c.accepted);
    if (firstRefused >= 0) expect(r.candidates.slice(firstRefused).every((c) => !c.accepted)).toBe(true);
  });

  it('says why a family cannot be fitted (negative values for the lognormal)', () => {
    const rng = new SeededRandom(2);
    const r = search(Array.from({ length: 200 }, () => rng.normal()));
    expect(r.candidates.find((c) => c.model === 'lognormal')!.note).toMatch(
      /not fitted: needs every value above zero/
    );
  });
});
