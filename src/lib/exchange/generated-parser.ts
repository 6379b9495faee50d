import type { z } from 'zod';
import { compileFn, withParser } from 'zod/v4/core';

/**
 * zod's compiled parsers, made where eval is allowed and used where it is not.
 *
 * zod compiles a schema (`compileFn`) by writing one JavaScript function for the whole schema and handing it to
 * `new Function`, with the values the code refers to (patterns, checks, child schemas) as parameters. The app's
 * Content-Security-Policy forbids that, so in the browser zod walks each schema as written: checking the
 * 2 000-process exchange file that way took 641 ms in Node against 273 ms compiled (Node 20, first run each,
 * ad-hoc script).
 *
 * The build writes the generated functions into the bundle instead (src/build/prebuilt-parsers.ts): it runs
 * `compileFn` in Node and records the parameter names and body of each function it hands to `new Function`. In
 * the browser, `compileFn` runs again on the same schema, and the constructor it reaches for is lent, for that one
 * call, a stand-in that answers with the function the build wrote for exactly those names and that body. So zod
 * builds the parameters' values from the schema in hand, and the parser is zod's own: the same schema decides, with
 * the same messages (every rejection is handed to the schema as written, as `z.compile` does). Where the body
 * differs from every one the build wrote, nothing is evaluated and the schema is used as written.
 */

/** What zod handed to `new Function`: the parameter names, then the body. */
export interface GeneratedParserSource {
  parameters: string[];
  body: string;
}

/** A function as the build wrote it, under the key of its parameters and body. */
export type PrebuiltParsers = ReadonlyMap<string, (...values: unknown[]) => unknown>;

/**
 * A key for a generated function's parameters and body: its length and two 32-bit FNV-1a hashes (different
 * offset bases). Only bodies the build wrote are looked up, and a changed schema changes its body's length or
 * hashes; the key does not need to be secret, only to tell them apart.
 */
export function generatedParserKey({ parameters, body }: GeneratedParserSource): string {
  const text = `${parameters.join(',')}\n${body}`;
  let a = 0x811c9dc5;
  let b = 0x01000193 ^ 0x5bd1e995;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    a = Math.imul(a ^ c, 0x01000193);
    b = Math.imul(b ^ c, 0x01000193);
  }
  return `${text.length}:${(a >>> 0).toString(36)}:${(b >>> 0).toString(36)}`;
}

/**
 * Runs zod's `compileFn` with `Function` lent, for that call, a stand-in that hands each generated function's
 * source to `make` and returns what `make` gives (zod looks `Function` up as it compiles and calls it with `new`:
 * the stand-in is a plain function, whose returned function `new` then gives back). Nothing else runs meanwhile:
 * the call is synchronous.
 */
function compileThrough<T extends z.ZodType>(
  schema: T,
  make: (source: GeneratedParserSource) => unknown
): ReturnType<typeof compileFn<T>> {
  const scope = globalThis as { Function: FunctionConstructor };
  const own = scope.Function;
  scope.Function = function standIn(...args: string[]) {
    const body = args.pop() ?? '';
    return make({ parameters: args, body });
  } as unknown as FunctionConstructor;
  try {
    return compileFn(schema);
  } finally {
    scope.Function = own;
  }
}

/**
 * The build's step: every function zod generates as it compiles `schema`, as it hands each to `new Function`.
 * There may be several: zod compiles some parts of a schema on their own first, and writes the whole schema's
 * code around those it could compile, so the browser must find each of them to be given the same whole.
 */
export function generatedParserSources(schema: z.ZodType): GeneratedParserSource[] {
  const sources: GeneratedParserSource[] = [];
  const own = Function;
  compileThrough(schema, (source) => {
    sources.push(source);
    return own(...source.parameters, source.body);
  });
  if (sources.length === 0) throw new Error('zod compiled the schema without generating a function');
  return sources;
}

/**
 * The schema with the build's parser for it installed, as `z.compile` installs one; the schema as written when the
 * build wrote none for it (or zod cannot compile it). Never evaluates code.
 */
export function withPrebuiltParser<T extends z.ZodType>(schema: T, prebuilt: PrebuiltParsers): T {
  try {
    const parser = compileThrough(schema, (source) => {
      const made = prebuilt.get(generatedParserKey(source));
      if (!made) throw new EvalError('no parser was built ahead of time for this schema');
      return made;
    });
    return withParser(schema, parser);
  } catch {
    return schema;
  }
}
