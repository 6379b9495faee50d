import { describe, expect, it } from 'vitest';
import { answerInParts } from '../workers/answer-parts';
import { workerService } from './worker-service';

/** A stand-in for a Worker: records what the page posts; `reply` delivers messages as a worker's would. */
class FakeWorker {
  onmessage: ((event: MessageEvent) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  posted: { id: number; [key: string]: unknown }[] = [];
  postMessage(message: { id: number }) {
    this.posted.push(message);
  }
  terminate() {}
  reply(message: object) {
    this.onmessage?.({ data: structuredClone(message) } as MessageEvent);
  }
}

describe('worker service', () => {
  it('puts an answer sent in parts back together, and keeps answers to different requests apart', async () => {
    const fake = new FakeWorker();
    const service = workerService<{ q: string }, { id: number; type: 'done'; figures: { movers: number[] } }>(
      () => fake as unknown as Worker,
      'Failed'
    );
    const first = service.ask({ q: 'a' });
    const second = service.ask({ q: 'b' });
    const [a, b] = fake.posted.map((m) => m.id) as [number, number];
    const movers = Array.from({ length: 2500 }, (_, i) => i);
    const sentA = answerInParts(a, { figures: { movers } }, [['figures', 'movers']]);
    const sentB = answerInParts(b, { figures: { movers: [9] } }, [['figures', 'movers']]);
    // Interleaved, as two requests' messages never are, to show the parts go by request.
    fake.reply(sentA.parts[0]!);
    fake.reply(sentB.parts[0]!);
    for (const part of sentA.parts.slice(1)) fake.reply(part);
    fake.reply({ type: 'done', ...sentA.answer, id: a });
    fake.reply({ type: 'done', ...sentB.answer, id: b });
    expect((await first).figures.movers).toEqual(movers);
    expect((await second).figures.movers).toEqual([9]);
  });

  it('rejects an answer in error and forgets its parts; ignores parts of requests not waiting', async () => {
    const fake = new FakeWorker();
    const service = workerService<object, { id: number; type: 'done'; list: number[] }>(
      () => fake as unknown as Worker,
      'The review could not be computed'
    );
    fake.reply({ id: 99, type: 'part', path: ['list'], entries: [1] });
    const asked = service.ask({});
    const id = fake.posted[0]!.id;
    fake.reply({ id, type: 'part', path: ['list'], entries: [1, 2] });
    fake.reply({ id, type: 'error', message: 'disk full' });
    await expect(asked).rejects.toThrow('The review could not be computed: disk full');
    const again = service.ask({});
    const next = fake.posted[1]!.id;
    fake.reply({ id: next, type: 'done', list: [] });
    expect((await again).list).toEqual([]);
  });
});
