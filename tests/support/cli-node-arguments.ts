import { readFileSync } from 'node:fs';

/**
 * How the npm script `cli` (package.json) starts node, without npm's own start: node's options, then the command
 * line's entry. Tests and benchmarks that start the command line directly start it so.
 */
export function cliNodeArguments(): string[] {
  const script = (
    JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as {
      scripts: { cli: string };
    }
  ).scripts.cli;
  const words = script.split(/\s+/);
  if (words[0] !== 'node') throw new Error(`the npm script cli no longer starts node: ${script}`);
  return words.slice(1);
}
