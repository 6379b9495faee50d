import { describe, expect, it } from 'vitest';
import { BUILT_IN_PROFILES, loweredSafetyTarget } from './context-profile';

const profile = (id: string) => structuredClone(BUILT_IN_PROFILES.find((p) => p.id === id)!);

describe('a safety target that asks less', () => {
  it("is caught below the built-in safety level and below the context's standard level, with both named", () => {
    const vehicle = profile('vehicle-parts');
    expect(loweredSafetyTarget(vehicle)).toBeUndefined();
    vehicle.levels.safety = 1.5;
    expect(loweredSafetyTarget(vehicle)).toEqual({ builtIn: 1.67 });
    vehicle.levels.safety = 1.2;
    expect(loweredSafetyTarget(vehicle)).toEqual({ builtIn: 1.67, standard: 1.33 });
    // A stricter safety target needs no reason.
    vehicle.levels.safety = 2;
    expect(loweredSafetyTarget(vehicle)).toBeUndefined();
  });

  it('reads a ppm target the other way round: more ppm asks less', () => {
    const ppm = BUILT_IN_PROFILES.find((p) => p.measure === 'ppm')!;
    const edited = structuredClone(ppm);
    edited.levels.safety = ppm.levels.safety * 2;
    expect(loweredSafetyTarget(edited)?.builtIn).toBe(ppm.levels.safety);
    edited.levels.safety = ppm.levels.safety / 2;
    expect(loweredSafetyTarget(edited)).toBeUndefined();
  });
});
