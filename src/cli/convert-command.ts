import { normalSf } from '../lib/stats/normal-distribution';
import { zFromPpm } from '../lib/stats/sigma-level';
import { numberFlag, parseArguments, rejectUnknown, stringFlag, UsageError } from './cli-arguments';
import type { CliIo } from './cli-io';
import { toJson } from './figure-report';
import { formatIndex, formatPpm, formatYield, PRINTED } from '../lib/domain/figure-format';

const KNOWN = ['ppm', 'yield', 'z', 'shift', 'json'];

/**
 * convert (--ppm X | --yield Y | --z Z) [--shift S]. Without --shift every figure is long-term. With --shift,
 * a given --z is read as a short-term sigma level (z-level = Z − S), and the output adds the short-term level
 * zLevel + S — the 1.5σ convention, labelled as such.
 */
export function convertCommand(argv: readonly string[], io: CliIo): number {
  const args = parseArguments(argv, ['json']);
  rejectUnknown(args, KNOWN, 'convert');
  const given = ['ppm', 'yield', 'z'].filter((k) => args.flags.has(k));
  if (given.length !== 1) throw new UsageError('Give exactly one of --ppm, --yield or --z');
  const shift = numberFlag(args, 'shift');
  let fraction: number;
  if (args.flags.has('ppm')) {
    const ppm = numberFlag(args, 'ppm') as number;
    if (!(ppm >= 0 && ppm <= 1e6)) throw new UsageError(`--ppm must lie between 0 and 1000000, got ${ppm}`);
    fraction = ppm / 1e6;
  } else if (args.flags.has('yield')) {
    const text = (stringFlag(args, 'yield') as string).trim();
    const percent = text.endsWith('%');
    const v = Number(text.replace('%', '').replace(',', '.'));
    if (!Number.isFinite(v))
      throw new UsageError(`--yield must be a fraction (0.9973) or a percent (99.73%), got '${text}'`);
    const y = percent ? v / 100 : v;
    if (!(y >= 0 && y <= 1))
      throw new UsageError(`--yield must be a fraction (0.9973) or a percent (99.73%), got '${text}'`);
    fraction = 1 - y;
  } else {
    const z = numberFlag(args, 'z') as number;
    fraction = normalSf(shift !== undefined ? z - shift : z);
  }
  const zLevel = zFromPpm(fraction * 1e6);
  const out: Record<string, unknown> = {
    ppm: fraction * 1e6,
    yield: 1 - fraction,
    zLevel,
    ...(shift !== undefined ? { shift, zLevelShortTerm: zLevel + shift } : {}),
    assumptions: [
      'z-level is the one-tail equivalent: Q⁻¹(ppm/10⁶), long-term',
      ...(shift !== undefined
        ? [
            `short-term sigma level = z-level + ${shift} (the shift convention of Six Sigma reporting; common practice, not a standard)`
          ]
        : [])
    ]
  };
  if (args.flags.has('json')) {
    io.stdout(toJson(out));
  } else {
    const lines = [
      `ppm                       ${formatPpm(fraction * 1e6, PRINTED)}`,
      `yield                     ${formatYield(1 - fraction, PRINTED)}`,
      `z-level (long-term)       ${formatIndex(zLevel, PRINTED)}`,
      ...(shift !== undefined
        ? [`short-term sigma level     ${formatIndex(zLevel + shift, PRINTED)}  (z-level + ${shift} shift)`]
        : []),
      '(figures rounded by the figure policy; --json gives them at full precision)'
    ];
    io.stdout(lines.join('\n'));
  }
  return 0;
}
