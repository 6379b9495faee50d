import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { answerInParts, appendPart } from './answer-parts';

describe('answer parts', () => {
  it('put back together give the answer, each part within its size, the answer sent unchanged (property)', () => {
    const line = fc.record({ id: fc.string(), z: fc.oneof(fc.double(), fc.constant(undefined)) });
    fc.assert(
      fc.property(
        fc.array(line, { maxLength: 60 }),
        fc.array(line, { maxLength: 60 }),
        fc.integer({ min: 1, max: 25 }),
        (processes, movers, perPart) => {
          const answer = { figures: { quarter: '2026-Q3', processes, movers }, sites: ['a'] };
          const before = structuredClone(answer);
          const paths = [
            ['figures', 'processes'],
            ['figures', 'movers']
          ];
          const { parts, answer: light } = answerInParts(7, answer, paths, perPart);
          expect(answer).toEqual(before);
          expect(light.figures.processes).toEqual([]);
          expect(light.figures.movers).toEqual([]);
          expect(parts.length).toBe(
            Math.ceil(processes.length / perPart) + Math.ceil(movers.length / perPart)
          );
          for (const part of parts) {
            expect(part).toMatchObject({ id: 7, type: 'part' });
            expect(part.entries.length).toBeGreaterThan(0);
            expect(part.entries.length).toBeLessThanOrEqual(perPart);
          }
          // As the page receives them: each message a copy.
          const received = structuredClone(light);
          for (const part of parts) appendPart(received, structuredClone(part));
          expect(received).toEqual(before);
        }
      ),
      { numRuns: 200, seed: 31 }
    );
  });

  it('say where a path leads to no list', () => {
    expect(() => answerInParts(1, { figures: {} }, [['figures', 'movers']])).toThrow(
      'No list at figures.movers in the answer'
    );
  });
});
