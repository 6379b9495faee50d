import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  duplicateKeyProblem,
  MAX_NESTING,
  structuralProblem,
  walkNamingProblems,
  walkStructure
} from './exchange-guards';

/** JSON text, and whether one of its objects writes a key twice. */
interface Written {
  text: string;
  repeated: boolean;
}

/**
 * JSON text written by hand, so that a key may repeat inside one object (JSON.stringify never repeats one): keys
 * from a small set that holds quotes, colons and backslashes, values that are strings with the same, numbers,
 * lists or further objects, and white space where JSON allows it.
 */
const space = fc.constantFrom('', ' ', '\n  ', '\t');
const key = fc.constantFrom('a', 'b', 'c:d', 'e"f', 'g\\', '"', ':');
const written: fc.Arbitrary<Written> = fc.letrec<{ value: Written; object: Written; list: Written }>(
  (tie) => ({
    value: fc.oneof(
      { depthSize: 'small' },
      fc.integer().map((n) => ({ text: String(n), repeated: false })),
      key.map((k) => ({ text: JSON.stringify(`${k}:`), repeated: false })),
      tie('list'),
      tie('object')
    ),
    list: fc.array(tie('value'), { maxLength: 4 }).map((xs) => ({
      text: `[${xs.map((x) => x.text).join(',')}]`,
      repeated: xs.some((x) => x.repeated)
    })),
    object: fc.array(fc.tuple(key, tie('value'), space, space), { maxLength: 5 }).map((pairs) => ({
      text: `{${pairs.map(([k, v, s1, s2]) => `${s1}${JSON.stringify(k)}${s2}:${s1}${v.text}`).join(',')}}`,
      repeated: new Set(pairs.map(([k]) => k)).size < pairs.length || pairs.some(([, v]) => v.repeated)
    }))
  })
).object;

describe('a key written twice in one object', () => {
  it('is found exactly where the text repeats a key, with the parsed value (keys counted first) or without', () => {
    let repeats = 0;
    fc.assert(
      fc.property(written, ({ text, repeated }) => {
        const searched = duplicateKeyProblem(text);
        expect(searched !== undefined).toBe(repeated);
        expect(duplicateKeyProblem(text, walkStructure(JSON.parse(text), Infinity).keys)).toBe(searched);
        if (repeated) repeats += 1;
      }),
      { numRuns: 2000, seed: 20261203 }
    );
    // Both kinds of text were tried.
    expect(repeats).toBeGreaterThan(100);
    expect(repeats).toBeLessThan(1900);
  });

  it('names the object and the key', () => {
    const text = '{"records":{"sites":[{"id":"s1","name":"A","name":"B"}]}}';
    expect(duplicateKeyProblem(text, walkStructure(JSON.parse(text), Infinity).keys)).toMatch(
      /^records\.sites\[0\]\.name: the key "name" appears twice in one object/
    );
    const clean = '{"a":{"b":"x:y","c":"\\"d\\":"}}';
    expect(duplicateKeyProblem(clean, walkStructure(JSON.parse(clean), Infinity).keys)).toBeUndefined();
  });
});

describe('the structure of a parsed file', () => {
  it('names where a problem sits, from the top of the file', () => {
    const deep: Record<string, unknown> = {};
    let at = deep;
    for (let i = 0; i < 20; i++) at = (at.x = {}) as Record<string, unknown>;
    expect(structuralProblem(deep, 10)).toBe(
      'x.x.x.x.x.x.x.x.x.x.x.x.x.x.x.x is nested more than 16 levels deep'
    );
    expect(structuralProblem({ records: { studies: [{ data: { values: [1, [2]] } }] } }, 10)).toBe(
      'records.studies[0].data.values[1] must be a number, not a list or object'
    );
    expect(structuralProblem({ records: { sites: [1, 2, 3] } }, 2)).toBe(
      'records.sites holds 3 entries, more than the 2 allowed'
    );
    expect(structuralProblem(JSON.parse('{"records":{"sites":[{"id":"s"},{"constructor":1}]}}'), 10)).toBe(
      'records.sites[1].constructor: the key "constructor" is not allowed in a Capstan file'
    );
    expect(structuralProblem([[[]]], 10)).toBeUndefined();
  });
});

/**
 * Parsed values of every structural kind: objects under keys that are allowed, forbidden or name measurement
 * lists, lists longer than the bound, and nesting past MAX_NESTING (written as text and parsed, so that
 * `__proto__` is an own key, as JSON.parse makes it).
 */
const structureKey = fc.constantFrom(
  'a',
  'b',
  'values',
  'subgroups',
  '__proto__',
  'constructor',
  'prototype',
  'x'
);
const structured: fc.Arbitrary<string> = fc.letrec<{ value: string; object: string; list: string }>(
  (tie) => ({
    value: fc.oneof(
      { depthSize: 'small', maxDepth: MAX_NESTING + 3 },
      fc.integer().map(String),
      fc.constant('null'),
      tie('list'),
      tie('object')
    ),
    list: fc.array(tie('value'), { maxLength: 5 }).map((xs) => `[${xs.join(',')}]`),
    object: fc
      .uniqueArray(fc.tuple(structureKey, tie('value')), { maxLength: 4, selector: ([k]) => k })
      .map((pairs) => `{${pairs.map(([k, v]) => `${JSON.stringify(k)}:${v}`).join(',')}}`)
  })
).value;

describe('the quick walk of a parsed file', () => {
  it('finds a problem exactly where the naming walk does, and counts the same keys (property)', () => {
    let problems = 0;
    fc.assert(
      fc.property(structured, fc.integer({ min: 1, max: 4 }), (text, maxArray) => {
        const value: unknown = JSON.parse(text);
        const named = walkNamingProblems(value, maxArray);
        expect(walkStructure(value, maxArray)).toEqual(named);
        if (named.problem) problems += 1;
      }),
      { numRuns: 3000, seed: 20261205 }
    );
    // Both kinds of value were tried.
    expect(problems).toBeGreaterThan(300);
    expect(problems).toBeLessThan(2700);
  });

  it('finds nesting past the bound and a measurement list holding a list', () => {
    let deep = '1';
    for (let i = 0; i < MAX_NESTING + 1; i++) deep = `{"a":${deep}}`;
    expect(walkStructure(JSON.parse(deep), 10).problem).toMatch(/nested more than 16 levels deep$/);
    expect(walkStructure({ s: [{ values: [1, 2, { n: 3 }] }] }, 10).problem).toBe(
      's[0].values[2] must be a number, not a list or object'
    );
    expect(walkStructure({ s: [{ values: [1, 2, 3, 4, 5] }] }, 2)).toEqual({ problem: undefined, keys: 2 });
    // A measurement list at each depth about the bound: the walks agree where the bound falls.
    for (let levels = MAX_NESTING - 3; levels <= MAX_NESTING + 1; levels++) {
      let text = '{"values":[1,2]}';
      for (let i = 0; i < levels; i++) text = `{"a":${text}}`;
      const value: unknown = JSON.parse(text);
      expect(walkStructure(value, 10)).toEqual(walkNamingProblems(value, 10));
      expect(walkStructure(value, 10).problem !== undefined).toBe(levels + 1 >= MAX_NESTING);
    }
  });
});
