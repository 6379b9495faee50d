import { describe, expect, it } from 'vitest';
import { BUILT_IN_PROFILES } from './context-profile';
import { effectiveProfiles, type ContextProfileRecord } from './context-profile-record';
import { parseContextProfileFields } from './context-profile-record-schema';

const base = {
  contextId: 'vehicle-parts',
  label: 'Vehicle parts',
  measure: 'index',
  levels: { standard: 1.5, key: 1.67, safety: 2 },
  reporting: 'long-term',
  confidence: 0.95,
  source: 'Customer X'
};

describe('context profiles', () => {
  it('validates the levels and the confidence', () => {
    expect(parseContextProfileFields(base).levels.standard).toBe(1.5);
    expect(() => parseContextProfileFields({ ...base, levels: { ...base.levels, key: -1 } })).toThrow(
      /Required level for key characteristics must be above zero/
    );
    expect(() => parseContextProfileFields({ ...base, confidence: 1.2 })).toThrow(/between 0.5 and 1/);
    expect(() => parseContextProfileFields({ ...base, measure: 'sigma' })).toThrow(/ruling measure/);
  });

  it('lays stored edits over the built-ins and keeps the rest, every built-in with its source note', () => {
    const stored = [
      { ...base, id: 'u', createdAt: '', updatedAt: '', rev: 1, deviceId: 'd' } as ContextProfileRecord
    ];
    const profiles = effectiveProfiles(BUILT_IN_PROFILES, stored);
    expect(profiles.find((p) => p.id === 'vehicle-parts')?.levels.standard).toBe(1.5);
    expect(profiles).toHaveLength(BUILT_IN_PROFILES.length);
    expect(BUILT_IN_PROFILES.every((p) => p.source.length > 20)).toBe(true);
    const gone = effectiveProfiles(BUILT_IN_PROFILES, [{ ...stored[0]!, deletedAt: 'x' }]);
    expect(gone.find((p) => p.id === 'vehicle-parts')?.levels.standard).toBe(1.33);
  });
});
