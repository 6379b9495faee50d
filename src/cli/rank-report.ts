import { BUILT_IN_PROFILES, type ContextProfile } from '../lib/domain/context-profile';
import { effectiveProfiles } from '../lib/domain/context-profile-record';
import { countOf, formatCount, formatIndex, PRINTED } from '../lib/domain/figure-format';
import {
  portfolioColumn,
  portfolioRowObject,
  writtenCell,
  zWithBasis,
  type PortfolioColumnKey
} from '../lib/domain/portfolio-columns';
import { rankPortfolio } from '../lib/domain/portfolio-ranking';
import type { PortfolioRecords } from '../lib/domain/portfolio-terms';
import type { RecordsByKind } from '../lib/domain/record-kinds';
import { isLive } from '../lib/domain/record-meta';

/** What `rank` was asked for, its arguments already checked. */
export interface RankRequest {
  /** The month the window ends in: `--period`, or the last month of `--quarter`; the latest study's when absent. */
  endPeriod?: string;
  windowMonths: number;
  json: boolean;
}

/** A portfolio to rank: its live records and the targets it is judged against. */
export interface RankedPortfolioInput {
  records: PortfolioRecords;
  profiles: readonly ContextProfile[];
}

/** An exchange file's records as `rank` ranks them: tombstones left out, its context profiles over the built-in ones. */
export function rankInputOfExchange(records: RecordsByKind): RankedPortfolioInput {
  return {
    records: {
      sites: records.sites.filter(isLive),
      processes: records.processes.filter(isLive),
      characteristics: records.characteristics.filter(isLive),
      studies: records.studies.filter(isLive),
      projects: records.projects.filter(isLive)
    },
    profiles:
      records.contextProfiles.length > 0
        ? effectiveProfiles(BUILT_IN_PROFILES, records.contextProfiles)
        : BUILT_IN_PROFILES
  };
}

/**
 * What `rank` prints for a portfolio: the table, or with `json` one object per row keyed by the portfolio's column
 * keys (domain/portfolio-columns.ts). Undefined when the portfolio holds no study and no month was given.
 */
export function rankReport(
  { records, profiles }: RankedPortfolioInput,
  request: RankRequest
): string | undefined {
  const window = request.windowMonths;
  const endPeriod = request.endPeriod ?? records.studies.reduce((a, s) => (s.period > a ? s.period : a), '');
  if (!endPeriod) return undefined;
  const json = request.json;
  // The table printed has no trend column: its rows are ranked without trend lines (the JSON has their slope).
  const rows = rankPortfolio(records, profiles, {
    endPeriod,
    windowMonths: window,
    ...(json ? {} : { trendMonths: 0 })
  });
  if (json) {
    const out = rows.map((r, i) => portfolioRowObject(r, i + 1));
    return JSON.stringify(
      { endPeriod, windowMonths: window, rows: out },
      (_k, v: unknown) => (typeof v === 'number' && !Number.isFinite(v) ? null : v),
      2
    );
  }
  const lines = [
    `Portfolio for the ${countOf(window, 'month', 'months', PRINTED)} ending ${endPeriod} (${countOf(rows.length, 'process', 'processes', PRINTED)}), highest priority first`,
    ''
  ];
  const printed: PortfolioColumnKey[] = [
    'rank',
    'priority',
    'status',
    'zLevel',
    'zGap',
    'costPerYear',
    'process',
    'site',
    'weakest'
  ];
  // The printed columns, looked up once for every row.
  const columns = printed.map(portfolioColumn);
  const zText = (z: number) => formatIndex(z, PRINTED);
  lines.push(columns.map((c) => (c.key === 'zLevel' ? 'z-level (LT/ST)' : c.label)).join('\t'));
  rows.forEach((row, i) => {
    lines.push(
      columns
        .map((c) => {
          if (c.key === 'zLevel') return zWithBasis(row, zText);
          if (c.key === 'costPerYear')
            return row.costPerYear === undefined
              ? '–'
              : `${formatCount(row.costPerYear, PRINTED)} ${row.process.currency}`;
          return writtenCell(c, row, i + 1, PRINTED) || '–';
        })
        .join('\t')
    );
  });
  lines.push(
    '',
    profiles === BUILT_IN_PROFILES
      ? 'Targets are the built-in context defaults; customer-specific and regulatory requirements prevail.'
      : "Targets are the file's context profiles over the built-in defaults; customer-specific and regulatory requirements prevail."
  );
  return lines.join('\n');
}
