import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalJson, canonicalJsonPiecewise } from './canonical-json';

/**
 * canonicalJson writes through JSON.stringify of a key-sorted copy; `canonicalJsonPiecewise` joins the text
 * itself. Any JSON value must give the same text both ways, including keys the engine orders by itself
 * (array indices), a key named __proto__, lone surrogates, -0 and numbers in exponent form.
 */
describe('canonical JSON', () => {
  it('writes keys in code-unit order, no white space, undefined keys left out (RFC 8785 ordering)', () => {
    expect(canonicalJson({ b: 1, a: [true, null, 'x'], c: undefined, A: { z: -0, y: 1e21 } })).toBe(
      '{"A":{"y":1e+21,"z":0},"a":[true,null,"x"],"b":1}'
    );
    expect(canonicalJson({ 10: 'ten', 2: 'two', x: 1 })).toBe('{"10":"ten","2":"two","x":1}');
    expect(canonicalJson(JSON.parse('{"__proto__":{"a":1},"b":2}'))).toBe('{"__proto__":{"a":1},"b":2}');
    expect(canonicalJson(['\ud800', 'é', '"\\\n'])).toBe('["\\ud800","é","\\"\\\\\\n"]');
  });

  it('gives the same text as writing it piece by piece, for 2 000 random JSON values', () => {
    const key = fc.oneof(fc.string(), fc.constantFrom('__proto__', '0', '12', '4294967295', 'constructor'));
    const value = fc.letrec((tie) => ({
      any: fc.oneof(
        { depthSize: 'small' },
        fc.double({ noNaN: true, noDefaultInfinity: true }),
        fc.string({ unit: 'binary' }),
        fc.boolean(),
        fc.constant(null),
        fc.array(tie('any')),
        fc.dictionary(key, tie('any'))
      )
    })).any;
    fc.assert(
      fc.property(value, (v) => {
        expect(canonicalJson(v)).toBe(canonicalJsonPiecewise(v));
        expect(JSON.parse(canonicalJson(v))).toEqual(JSON.parse(JSON.stringify(v)));
      }),
      { numRuns: 2000 }
    );
  });

  it('gives the same text for lists of records whose objects repeat a few key lists, in any order (property)', () => {
    // As a file's records do: the same few keys over and over, sometimes in another order, with or without
    // __proto__ or an array index among them, nested one level (a record's data or version vector).
    const key = fc.constantFrom(
      'id',
      'rev',
      'data',
      'n',
      'kind',
      'vv',
      '__proto__',
      'constructor',
      'toJSON',
      '7'
    );
    const leaf = fc.oneof(
      fc.integer(),
      fc.string({ maxLength: 3 }),
      fc.constant(undefined),
      fc.constant(null)
    );
    const inner = fc.dictionary(key, leaf, { maxKeys: 5 });
    const record = fc.dictionary(key, fc.oneof(leaf, inner), { maxKeys: 6 });
    // The keys' written order (a dictionary's) is kept by JSON.parse: parse its canonical text back in another order.
    const reordered = record.chain((r) =>
      fc.shuffledSubarray(Object.keys(r), { minLength: Object.keys(r).length }).map((keys) => {
        const out: Record<string, unknown> = Object.create(null) as Record<string, unknown>;
        for (const k of keys) out[k] = r[k];
        return out;
      })
    );
    fc.assert(
      fc.property(fc.array(fc.oneof(record, reordered), { maxLength: 40 }), (records) => {
        expect(canonicalJson(records)).toBe(canonicalJsonPiecewise(records));
        expect(canonicalJson({ records })).toBe(canonicalJsonPiecewise({ records }));
      }),
      { numRuns: 1500, seed: 8 }
    );
  });

  it('refuses what JSON cannot hold, naming where', () => {
    expect(() => canonicalJson({ a: [1, Number.NaN] })).toThrow(/a\[1\] is not a finite number/);
    let deep: unknown = 1;
    for (let i = 0; i < 70; i++) deep = [deep];
    expect(() => canonicalJson(deep)).toThrow(/nested more than 64 levels deep/);
  });
});
