import { readdirSync, readFileSync } from 'node:fs';
import { prebuiltParsers } from 'virtual:capstan-prebuilt-parsers';
import { z } from 'zod';
import { afterAll, describe, expect, it } from 'vitest';
import { demoRecordSet, testFileHeader } from '../../../tests/support/demo-change-set';
import { verdictWithHost } from '../../../tests/support/host-verdict';
import { changeSetOf, encodeExchangeFile } from './exchange-file';
import { useExchangeHost, WEB_HOST, type ExchangeHost } from './exchange-host';
import { exchangeFileSchema } from './exchange-schema';
import { generatedParserKey, generatedParserSources, withPrebuiltParser } from './generated-parser';
import { PREBUILT_EXCHANGE_HOST } from './prebuilt-exchange-host';

/**
 * The exchange worker checks files with zod's parser for the exchange schema, written into the bundle by the build
 * (src/build/prebuilt-parsers.ts; these tests import the same module, made by the same plugin). It must be found
 * without evaluating any code, and give the schema's verdicts exactly: every file of the bad-file corpus refused
 * with the same message, a valid file read into the same records.
 */
const corpus = new URL('../../../tests/fixtures/bad-exchange-files/', import.meta.url);
const now = Date.now();
afterAll(() => void useExchangeHost(WEB_HOST));

/** Runs `work` with `Function` refusing, as the app's Content-Security-Policy makes it in the browser. */
function withEvalRefused<T>(work: () => T): T {
  const scope = globalThis as { Function: FunctionConstructor };
  const own = scope.Function;
  let asked = 0;
  scope.Function = function refused() {
    asked++;
    throw new EvalError('Evaluating a string as JavaScript is refused (stand-in for the page policy)');
  } as unknown as FunctionConstructor;
  try {
    const result = work();
    expect(asked, 'nothing was handed to Function').toBe(0);
    return result;
  } finally {
    scope.Function = own;
  }
}

/** Whether `schema` is a clone carrying an installed parser (zod's withParser keeps the runtime as fallback). */
function hasInstalledParser(schema: z.ZodType): boolean {
  return (schema._zod.bag as { fallbackRun?: unknown }).fallbackRun !== undefined;
}

const outcome = (host: ExchangeHost, bytes: Uint8Array) => verdictWithHost(host, bytes, now);

describe("the exchange schema's parser built ahead of time", () => {
  it('is installed where evaluating code is refused', () => {
    const prepared = withEvalRefused(() => PREBUILT_EXCHANGE_HOST.prepareSchema(exchangeFileSchema));
    expect(prepared).not.toBe(exchangeFileSchema);
    expect(hasInstalledParser(prepared)).toBe(true);
  });

  it('is the function zod generates for the schema now (the build wrote it from these sources)', () => {
    const sources = generatedParserSources(exchangeFileSchema);
    for (const source of sources) expect(prebuiltParsers.has(generatedParserKey(source))).toBe(true);
  });

  it('leaves a schema the build wrote no parser for as written, evaluating nothing', () => {
    const other = z.strictObject({ count: z.number().int(), name: z.string().max(8) });
    expect(withEvalRefused(() => PREBUILT_EXCHANGE_HOST.prepareSchema(other))).toBe(other);
    // A parser written for another schema is never taken for this one.
    const stale = new Map(
      generatedParserSources(other).map((s) => [generatedParserKey(s), () => () => 'wrong'])
    );
    expect(withEvalRefused(() => withPrebuiltParser(exchangeFileSchema, stale))).toBe(exchangeFileSchema);
  });

  it('keys a body by every character', () => {
    const source = generatedParserSources(exchangeFileSchema).at(-1)!;
    const key = generatedParserKey(source);
    const at = source.body.indexOf('40');
    const edited = { ...source, body: `${source.body.slice(0, at)}41${source.body.slice(at + 2)}` };
    expect(generatedParserKey(edited)).not.toBe(key);
    expect(generatedParserKey({ ...source, parameters: [...source.parameters].reverse() })).not.toBe(key);
  });

  const files = readdirSync(corpus).filter((f) => f.includes('.capstan.json'));
  it.each(files)(
    '%s: the same verdict as the schema as written',
    async (file) => {
      const bytes = new Uint8Array(readFileSync(new URL(file, corpus)));
      expect(await outcome(PREBUILT_EXCHANGE_HOST, bytes)).toEqual(await outcome(WEB_HOST, bytes));
    },
    30_000
  );

  it('reads a valid file into the same records as the schema as written', async () => {
    const written = await encodeExchangeFile(changeSetOf(testFileHeader('host test'), demoRecordSet(now)));
    const app = (await outcome(WEB_HOST, written)) as { records?: unknown };
    expect(app).toHaveProperty('records');
    expect(await outcome(PREBUILT_EXCHANGE_HOST, written)).toEqual(app);
  });
});
