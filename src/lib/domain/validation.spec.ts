import { describe, expect, it } from 'vitest';
import { parseCharacteristicFields } from './characteristic-schema';
import { parseImprovementProjectFields } from './improvement-project-schema';
import { parseProcessFields } from './process-schema';
import { parseSiteFields } from './site-schema';
import { parseStudyFields } from './study-schema';
import { ValidationError } from './validation-error';

const PROCESS_ID = '1b4e28ba-2fa1-41d2-883f-0016d3cca427';
const CHAR_ID = '6fa459ea-ee8a-4ca4-894e-db77e160355e';

/** Runs a parser expected to refuse its input and returns the problems it listed. */
function problemsOf(parse: () => unknown) {
  try {
    parse();
  } catch (error) {
    expect(error).toBeInstanceOf(ValidationError);
    return (error as ValidationError).problems;
  }
  throw new Error('expected the input to be refused');
}

const measured = {
  processId: PROCESS_ID,
  name: 'Bore diameter',
  unit: 'mm',
  dataKind: 'measured',
  lsl: 10.0,
  usl: 10.2,
  riskClass: 'key'
};

describe('characteristic validation', () => {
  it('accepts a two-sided measured characteristic', () => {
    expect(parseCharacteristicFields(measured)).toMatchObject({ lsl: 10, usl: 10.2 });
  });

  it('refuses LSL greater than USL, naming the field and both values', () => {
    const problems = problemsOf(() => parseCharacteristicFields({ ...measured, lsl: 10.3 }));
    expect(problems).toEqual([{ field: 'usl', message: 'USL (10.2) must be greater than LSL (10.3)' }]);
  });

  it('refuses LSL equal to USL', () => {
    const problems = problemsOf(() => parseCharacteristicFields({ ...measured, lsl: 10.2 }));
    expect(problems[0]?.field).toBe('usl');
  });

  it('requires at least one limit for measured data but not for counted data', () => {
    const problems = problemsOf(() =>
      parseCharacteristicFields({ ...measured, lsl: undefined, usl: undefined })
    );
    expect(problems[0]?.message).toMatch(/at least one limit/);
    expect(
      parseCharacteristicFields({ ...measured, dataKind: 'counted', lsl: undefined, usl: undefined }).dataKind
    ).toBe('counted');
  });

  it('accepts a one-sided limit', () => {
    expect(parseCharacteristicFields({ ...measured, lsl: undefined }).usl).toBe(10.2);
  });

  it('refuses a target outside the limits and an unknown risk class', () => {
    expect(problemsOf(() => parseCharacteristicFields({ ...measured, target: 11 }))[0]?.field).toBe('target');
    expect(
      problemsOf(() => parseCharacteristicFields({ ...measured, riskClass: 'critical' }))[0]?.field
    ).toBe('riskClass');
  });

  it('refuses a limit given as text', () => {
    const problems = problemsOf(() => parseCharacteristicFields({ ...measured, usl: '10.2' }));
    expect(problems).toEqual([{ field: 'usl', message: "USL must be a finite number, got '10.2'" }]);
  });
});

const study = (data: unknown, period = '2026-03') => ({
  characteristicId: CHAR_ID,
  period,
  data,
  enteredBy: 'Lead'
});

describe('study validation', () => {
  it('accepts each kind of data', () => {
    expect(parseStudyFields(study({ kind: 'raw', values: [1, 2, 3] })).data.kind).toBe('raw');
    expect(parseStudyFields(study({ kind: 'summary', n: 30, mean: 5, sd: 0.2 })).data.kind).toBe('summary');
    expect(parseStudyFields(study({ kind: 'defectives', units: 100, defectives: 0 })).data.kind).toBe(
      'defectives'
    );
    expect(
      parseStudyFields(study({ kind: 'defects', units: 10, defects: 3, opportunitiesPerUnit: 4 })).data.kind
    ).toBe('defects');
  });

  it.each(['2026-13', '2026-1', '26-01', '2026/01', '2026-00', 'March 2026', ''])(
    'refuses period %j',
    (period) => {
      const problems = problemsOf(() => parseStudyFields(study({ kind: 'raw', values: [1] }, period)));
      expect(problems).toEqual([
        { field: 'period', message: `Period '${period}' is not a month written YYYY-MM` }
      ]);
    }
  );

  it('refuses a negative count', () => {
    const problems = problemsOf(() =>
      parseStudyFields(study({ kind: 'defectives', units: 100, defectives: -1 }))
    );
    expect(problems).toEqual([{ field: 'data.defectives', message: 'Defectives must not be negative' }]);
  });

  it('refuses a fractional count', () => {
    const problems = problemsOf(() =>
      parseStudyFields(study({ kind: 'defectives', units: 100.5, defectives: 1 }))
    );
    expect(problems[0]).toEqual({ field: 'data.units', message: 'Units inspected must be a whole number' });
  });

  it('refuses more defectives than units inspected', () => {
    const problems = problemsOf(() =>
      parseStudyFields(study({ kind: 'defectives', units: 100, defectives: 101 }))
    );
    expect(problems).toEqual([
      { field: 'data.defectives', message: 'Defectives (101) cannot exceed units inspected (100)' }
    ]);
  });

  it('refuses more defects than opportunities', () => {
    const problems = problemsOf(() =>
      parseStudyFields(study({ kind: 'defects', units: 10, defects: 41, opportunitiesPerUnit: 4 }))
    );
    expect(problems[0]?.message).toBe('Defects (41) cannot exceed units × opportunities (40)');
  });

  it.each([
    ['text', 'abc', "measurement 'abc' is not a finite number"],
    ['NaN', Number.NaN, 'measurement NaN is not a finite number'],
    ['Infinity', Number.POSITIVE_INFINITY, 'measurement Infinity is not a finite number'],
    ['empty cell', null, 'measurement nothing is not a finite number']
  ])('refuses a non-numeric measurement (%s) and says which one', (_label, bad, message) => {
    const problems = problemsOf(() => parseStudyFields(study({ kind: 'raw', values: [1.2, 1.3, 1.1, bad] })));
    expect(problems).toEqual([{ field: 'data.values[3]', message }]);
  });

  it('refuses a summary with n below 2 or a negative sd', () => {
    expect(
      problemsOf(() => parseStudyFields(study({ kind: 'summary', n: 1, mean: 5, sd: 0 })))[0]?.field
    ).toBe('data.n');
    expect(
      problemsOf(() => parseStudyFields(study({ kind: 'summary', n: 5, mean: 5, sd: -1 })))[0]?.field
    ).toBe('data.sd');
  });

  it('refuses subgroup ids that do not pair with the values', () => {
    const problems = problemsOf(() =>
      parseStudyFields(study({ kind: 'raw', values: [1, 2, 3], subgroups: ['a', 'b'] }))
    );
    expect(problems[0]?.field).toBe('data.subgroups');
  });

  it('drops unknown keys, __proto__ included', () => {
    const input = JSON.parse(
      '{"characteristicId":"6fa459ea-ee8a-4ca4-894e-db77e160355e","period":"2026-01","enteredBy":"x",' +
        '"data":{"kind":"raw","values":[1]},"__proto__":{"polluted":true},"extra":1}'
    );
    const parsed = parseStudyFields(input) as unknown as Record<string, unknown>;
    expect(parsed.extra).toBeUndefined();
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

describe('site, process and project validation', () => {
  it('refuses an unknown time zone and an empty name', () => {
    const problems = problemsOf(() => parseSiteFields({ name: ' ', region: '', timeZone: 'Mars/Olympus' }));
    expect(problems.map((p) => p.field)).toEqual(['name', 'timeZone']);
  });

  it('refuses a negative monthly volume and a malformed currency', () => {
    const problems = problemsOf(() =>
      parseProcessFields({
        siteId: PROCESS_ID,
        name: 'Filling',
        owner: '',
        contextId: 'packaged-goods',
        monthlyVolume: -5,
        costPerDefective: 1,
        currency: 'euro'
      })
    );
    expect(problems.map((p) => p.field)).toEqual(['monthlyVolume', 'currency']);
  });

  it('refuses an unknown phase and a target date before the start', () => {
    const base = {
      processId: PROCESS_ID,
      title: 'Fewer rejects',
      owner: '',
      startDate: '2026-03-01',
      expectedAnnualSaving: 0
    };
    expect(problemsOf(() => parseImprovementProjectFields({ ...base, phase: 'Sustain' }))[0]?.field).toBe(
      'phase'
    );
    expect(
      problemsOf(() =>
        parseImprovementProjectFields({ ...base, phase: 'Define', targetDate: '2026-02-01' })
      )[0]?.field
    ).toBe('targetDate');
    expect(
      problemsOf(() =>
        parseImprovementProjectFields({ ...base, phase: 'Define', startDate: '2026-02-30' })
      )[0]?.field
    ).toBe('startDate');
  });
});
