/**
 * The ranking reads its studies through an index built once per record set (domain/portfolio-index.ts), finds
 * windows by month numbers and remembers window figures across calls. None of that may change a figure. Over
 * random portfolios — several sites, measured and counted characteristics, limit changes, deleted and archived
 * records, studies arriving in any order (as after a merge) — the ranking and the review's quarter headlines are
 * compared with a plain computation that scans every record for every characteristic, to 1e-9.
 */
import { WindowFiguresCache } from '../../src/lib/domain/window-figures-cache';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Characteristic, RiskClass } from '../../src/lib/domain/characteristic';
import {
  BUILT_IN_PROFILES,
  profileFor,
  shortTermShift,
  type ContextProfile
} from '../../src/lib/domain/context-profile';
import { addMonths, periodsOfQuarter } from '../../src/lib/domain/period';
import {
  costPerYear,
  judgeCharacteristic,
  portfolioStandings,
  processTrends,
  quickYield,
  rankedPortfolio,
  rankPortfolio,
  standingOfRow,
  withTrends,
  type FiguresCache,
  type PortfolioRecords,
  type ProcessRow
} from '../../src/lib/domain/portfolio-ranking';
import { MonthlyStatistics } from '../../src/lib/domain/monthly-statistics';
import { listRowAt } from '../../src/lib/domain/portfolio-list-columns';
import { listColumnsOf } from '../../src/lib/domain/portfolio-list-of-ranking';
import type { PortfolioListRow } from '../../src/lib/domain/portfolio-list-row';
import type { Process } from '../../src/lib/domain/process';
import { buildQuarterReview, headlineOf } from '../../src/lib/domain/quarter-review';
import type { RecordMeta } from '../../src/lib/domain/record-meta';
import { limitVersionOf } from '../../src/lib/domain/specification-history';
import type { Study } from '../../src/lib/domain/study';
import { capabilityOfStudy } from '../../src/lib/domain/study-capability';
import { windowData } from '../../src/lib/domain/window-study';
import { windowFiguresOf } from '../../src/lib/domain/window-figures';
import { normalUpperQuantile } from '../../src/lib/stats/normal-distribution';

const meta = (id: string, rev = 1): RecordMeta => ({ id, createdAt: '', updatedAt: '', rev, deviceId: 'd' });
const MONTHS = Array.from({ length: 15 }, (_, i) => addMonths('2025-10', i));

/** The plain computation: for each characteristic, scan every study; no index, no cache, no month numbers. */
function plainRanking(
  records: PortfolioRecords,
  endPeriod: string,
  windowMonths: number,
  trendMonths: number
) {
  const first = addMonths(endPeriod, -(windowMonths - 1));
  const trendFirst = addMonths(endPeriod, -(trendMonths - 1));
  const out = new Map<string, Partial<ProcessRow> & { trendPlain: (number | undefined)[] }>();
  for (const process of records.processes) {
    if (process.deletedAt || process.archivedAt) continue;
    if (!records.sites.some((s) => s.id === process.siteId && !s.deletedAt)) continue;
    const profile = profileFor(BUILT_IN_PROFILES, process.contextId);
    const shift = shortTermShift(profile);
    const chars = records.characteristics.filter(
      (c) => c.processId === process.id && !c.deletedAt && !c.archivedAt
    );
    const rows = chars.map((c) => {
      const mine = records.studies.filter(
        (s) => s.characteristicId === c.id && !s.deletedAt && s.period <= endPeriod
      );
      const version = limitVersionOf(c, endPeriod);
      const inWindow = mine.filter((s) => s.period >= first && limitVersionOf(c, s.period) === version);
      const w = windowData(inWindow);
      let result;
      try {
        result = w
          ? windowFiguresOf(
              capabilityOfStudy(
                { data: w.data, period: endPeriod },
                c,
                w.sdWithin ? { sdWithin: w.sdWithin } : {}
              )
            )
          : undefined;
      } catch {
        result = undefined;
      }
      return { c, mine, row: judgeCharacteristic(c, result, profile, w?.months.length ?? 0, endPeriod) };
    });
    const withData = rows.filter((r) => r.row.result);
    const trendPlain: (number | undefined)[] = [];
    for (let m = 0; m < trendMonths; m += 1) {
      const period = addMonths(trendFirst, m);
      let product = 1;
      let count = 0;
      for (const { c, mine } of rows)
        for (const s of mine.filter((x) => x.period === period)) {
          const y = quickYield(s, c);
          if (y === undefined) continue;
          product *= y;
          count += 1;
        }
      trendPlain.push(
        count > 0 && count === chars.length
          ? normalUpperQuantile(Math.min(1, 1 - product)) + shift
          : undefined
      );
    }
    const y = withData.length ? withData.reduce((a, r) => a * r.row.result!.yield, 1) : undefined;
    out.set(process.id, {
      status: rows.length
        ? ((['short', 'meets, not shown', 'meets, shown'] as const).find((s) =>
            rows.some((r) => r.row.status === s)
          ) ?? 'no recent data')
        : 'no recent data',
      ...(y !== undefined
        ? {
            yield: y,
            zLevel: normalUpperQuantile(Math.min(1, 1 - y)) + shift,
            costPerYear: costPerYear(1 - y, process)
          }
        : {}),
      trendPlain
    });
  }
  return out;
}

/**
 * The list row a full row stands for, written out plainly: what the table draws (a figure not known is left
 * out; the trend line is asked for separately).
 */
function listFiguresOf(row: ProcessRow): PortfolioListRow {
  const w = row.weakest;
  const present = <T extends object>(o: T) =>
    Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
  return {
    process: {
      id: row.process.id,
      name: row.process.name,
      contextId: row.process.contextId,
      currency: row.process.currency
    },
    site: { id: row.site.id, name: row.site.name },
    measure: row.profile?.measure,
    status: row.status,
    riskClass: row.riskClass,
    zBasis: row.zBasis,
    badges: row.badges,
    projects: row.projects.map((p) => ({ id: p.id, phase: p.phase })),
    ...present({
      yield: row.yield,
      ppm: row.ppm,
      zLevel: row.zLevel,
      costPerYear: row.costPerYear,
      requiredZ: row.requiredZ
    }),
    ...(w
      ? {
          weakest: {
            name: w.characteristic.name,
            required: w.required,
            ...present({ estimate: w.estimate, bound: w.bound, requiredZ: w.requiredZ }),
            ...(w.result?.cpk !== undefined || w.result?.ppk !== undefined
              ? { result: present({ cpk: w.result.cpk, ppk: w.result.ppk }) }
              : {})
          }
        }
      : {})
  };
}

const portfolioArb = fc
  .record({
    processes: fc.array(
      fc.record({
        site: fc.integer({ min: 0, max: 2 }),
        context: fc.integer({ min: 0, max: BUILT_IN_PROFILES.length - 1 }),
        deleted: fc.boolean().map((b) => b && Math.random() < 0.3),
        chars: fc.array(
          fc.record({
            counted: fc.boolean(),
            // Counted as defects (with each month's opportunities per unit, which may differ), else defectives.
            defects: fc.boolean(),
            archived: fc.integer({ min: 0, max: 9 }).map((x) => x === 0),
            change: fc.option(
              fc.record({
                month: fc.integer({ min: 1, max: 14 }),
                half: fc.double({ min: 1, max: 3, noNaN: true })
              })
            ),
            months: fc.array(
              fc.record({
                month: fc.integer({ min: 0, max: 14 }),
                raw: fc.boolean(),
                mean: fc.double({ min: 9, max: 11, noNaN: true }),
                sd: fc.double({ min: 0.2, max: 1.2, noNaN: true }),
                defectives: fc.integer({ min: 0, max: 40 }),
                opportunities: fc.integer({ min: 1, max: 3 }),
                deleted: fc.integer({ min: 0, max: 9 }).map((x) => x === 0),
                rev: fc.integer({ min: 1, max: 4 })
              }),
              { maxLength: 12 }
            )
          }),
          { minLength: 1, maxLength: 3 }
        )
      }),
      { minLength: 1, maxLength: 8 }
    ),
    seed: fc.integer()
  })
  .map(({ processes, seed }): PortfolioRecords => {
    const sites = [0, 1, 2].map((i) => ({
      ...meta(`s${i}`),
      name: `Site ${i}`,
      region: '',
      timeZone: 'UTC'
    }));
    const ps: Process[] = [];
    const cs: Characteristic[] = [];
    const studies: Study[] = [];
    processes.forEach((p, pi) => {
      ps.push({
        ...meta(`p${pi}`),
        siteId: `s${p.site}`,
        name: `Process ${pi}`,
        owner: '',
        contextId: BUILT_IN_PROFILES[p.context]!.id,
        monthlyVolume: 1000 + pi,
        costPerDefective: 3,
        currency: 'EUR',
        ...(p.deleted ? { deletedAt: '2026-01-01T00:00:00Z' } : {})
      });
      p.chars.forEach((c, ci) => {
        const id = `c${pi}-${ci}`;
        cs.push({
          ...meta(id),
          processId: `p${pi}`,
          name: `Char ${ci}`,
          unit: '',
          dataKind: c.counted ? 'counted' : 'measured',
          riskClass: ci === 0 ? 'key' : 'standard',
          ...(c.counted ? {} : { lsl: 7, usl: 13 }),
          ...(c.archived ? { archivedAt: '2026-01-01T00:00:00Z' } : {}),
          ...(c.change && !c.counted
            ? {
                limitChanges: [
                  { from: MONTHS[c.change.month]!, lsl: 10 - c.change.half, usl: 10 + c.change.half }
                ]
              }
            : {})
        });
        const seen = new Set<number>();
        c.months.forEach((m, mi) => {
          if (seen.has(m.month)) return; // one live study per characteristic and month (the stored invariant)
          seen.add(m.month);
          const values = Array.from({ length: 8 }, (_, k) => m.mean + m.sd * Math.sin(k * 1.7 + mi + seed));
          studies.push({
            ...meta(`${id}-${m.month}`, m.rev),
            characteristicId: id,
            period: MONTHS[m.month]!,
            enteredBy: '',
            data: c.counted
              ? c.defects
                ? {
                    kind: 'defects',
                    units: 500,
                    defects: m.defectives,
                    opportunitiesPerUnit: m.opportunities
                  }
                : { kind: 'defectives', units: 500, defectives: m.defectives }
              : m.raw
                ? { kind: 'raw', values }
                : { kind: 'summary', n: 30, mean: m.mean, sd: m.sd },
            ...(m.deleted ? { deletedAt: '2026-01-01T00:00:00Z' } : {})
          });
        });
      });
    });
    // Records arrive in any order after merges: shuffle the studies deterministically.
    let s = seed >>> 0 || 1;
    for (let i = studies.length - 1; i > 0; i -= 1) {
      s = (s * 1103515245 + 12345) >>> 0;
      const j = s % (i + 1);
      [studies[i], studies[j]] = [studies[j]!, studies[i]!];
    }
    return { sites, processes: ps, characteristics: cs, studies, projects: [] };
  });

/**
 * A read model that reached `studies` the way a device's does: earlier versions first (another month, other
 * figures, some deleted — as edits and merges bring them), then the final ones, applied in batches of random
 * size; a rebuild where the model asks for one, as its owner would.
 */
function modelThroughHistory(studies: readonly Study[], seed: number): MonthlyStatistics {
  let s = seed >>> 0 || 1;
  const rnd = () => (s = (s * 1103515245 + 12345) >>> 0) / 2 ** 32;
  const history: Study[] = [];
  for (const study of studies)
    if (rnd() < 0.5)
      history.push({
        ...study,
        period: MONTHS[Math.floor(rnd() * MONTHS.length)]!,
        data: { kind: 'summary', n: 5, mean: 10 + rnd(), sd: 0.5 + rnd() },
        ...(rnd() < 0.2 ? { deletedAt: '2025-01-01T00:00:00Z' } : {})
      });
  history.push(...studies);
  const stored = new Map<string, Study>();
  let model = new MonthlyStatistics();
  for (let i = 0; i < history.length;) {
    const batch = history.slice(i, (i += 1 + Math.floor(rnd() * 5)));
    for (const study of batch) stored.set(study.id, study);
    model.putAll(batch);
    if (model.needsRebuild) model = MonthlyStatistics.fromStudies([...stored.values()]);
  }
  return model;
}

/** Each ranked row's status, yield, z-level, cost and trend are the plain computation's. */
function expectPlainFigures(rows: readonly ProcessRow[], plain: ReturnType<typeof plainRanking>): void {
  for (const row of rows) {
    const p = plain.get(row.process.id)!;
    expect(row.status).toBe(p.status);
    close(row.yield, p.yield);
    close(row.zLevel, p.zLevel);
    close(row.costPerYear, p.costPerYear);
    row.trend.forEach((z, i) => close(z, p.trendPlain[i]));
  }
}

function close(a: number | undefined, b: number | undefined): void {
  if (a === undefined || b === undefined || !Number.isFinite(a) || !Number.isFinite(b)) expect(a).toBe(b);
  else expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(b)));
}

describe('the indexed, cached ranking gives the figures of a plain record-by-record computation (property)', () => {
  it('holds over 150 random portfolios, for several windows, with the cache warm and cold', () => {
    fc.assert(
      fc.property(
        portfolioArb,
        fc.integer({ min: 2, max: 14 }),
        fc.constantFrom(1, 3, 12),
        (records, end, window) => {
          const endPeriod = MONTHS[end]!;
          const plain = plainRanking(records, endPeriod, window, 6);
          const cache: FiguresCache = new WindowFiguresCache();
          for (const pass of [0, 1]) {
            const rows = rankPortfolio(records, BUILT_IN_PROFILES, {
              endPeriod,
              windowMonths: window,
              trendMonths: 6,
              cache
            });
            expect(rows.length, `pass ${pass}`).toBe(plain.size);
            for (const row of rows) expect(row.trend.length).toBe(6);
            expectPlainFigures(rows, plain);
          }
        }
      ),
      { numRuns: 150, seed: 20261202 }
    );
  });

  it('holds with a read model updated in place through a history of earlier versions, moves and deletions', () => {
    fc.assert(
      fc.property(portfolioArb, fc.integer(), fc.integer({ min: 2, max: 14 }), (records, seed, end) => {
        const statistics = modelThroughHistory(records.studies, seed);
        const endPeriod = MONTHS[end]!;
        const plain = plainRanking(records, endPeriod, 3, 6);
        const rows = rankPortfolio({ ...records, statistics }, BUILT_IN_PROFILES, {
          endPeriod,
          windowMonths: 3,
          trendMonths: 6,
          cache: new WindowFiguresCache()
        });
        expect(rows.length).toBe(plain.size);
        expectPlainFigures(rows, plain);
      }),
      { numRuns: 150, seed: 20261204 }
    );
  });

  it('ranks a record set read again (new objects, the same revisions) with its own objects, from the windows kept', () => {
    // As a worker reads the records again after a write elsewhere: the kept windows are found by revision, and
    // each is handed over with the characteristic object of the records ranked (a row names the one it is given).
    fc.assert(
      fc.property(portfolioArb, fc.integer({ min: 2, max: 14 }), (records, end) => {
        const options = {
          endPeriod: MONTHS[end]!,
          windowMonths: 3,
          trendMonths: 6,
          cache: new WindowFiguresCache()
        };
        const first = rankPortfolio(records, BUILT_IN_PROFILES, options);
        const again: PortfolioRecords = {
          ...structuredClone({ ...records, studies: [] }),
          studies: records.studies
        };
        const computed = options.cache.computed;
        const rows = rankPortfolio(again, BUILT_IN_PROFILES, options);
        // Nothing computed again.
        expect(options.cache.computed).toBe(computed);
        expect(rows).toEqual(first);
        const ownObjects = new Set(again.characteristics);
        for (const row of rows)
          for (const c of row.characteristics) expect(ownObjects.has(c.characteristic)).toBe(true);
      }),
      { numRuns: 60, seed: 20261205 }
    );
  });

  it('ranks two record sets of one model alike when they take turns with one cache, one with other limits', () => {
    // The windows kept are shared by every record set of a model. Record set B edits a characteristic's limits
    // (a new revision): its window is computed again into the same row, over A's. A, judged again afterwards
    // (a target change) and asked for its rows, must still give its own figures — as a ranking from scratch does.
    fc.assert(
      fc.property(portfolioArb, fc.integer({ min: 2, max: 14 }), fc.nat(), (records, end, which) => {
        const measured = records.characteristics.filter((c) => c.dataKind === 'measured' && !c.deletedAt);
        if (measured.length === 0) return;
        const edited = measured[which % measured.length]!;
        // Arrays of its own where it differs, and for its processes: each record set keeps its own plan.
        const b: PortfolioRecords = {
          ...records,
          processes: [...records.processes],
          characteristics: records.characteristics.map((c) =>
            c === edited ? { ...c, rev: c.rev + 1, lsl: (c.lsl ?? 0) - 0.5, usl: (c.usl ?? 20) + 0.5 } : c
          )
        };
        const options = {
          endPeriod: MONTHS[end]!,
          windowMonths: 3,
          trendMonths: 6,
          cache: new WindowFiguresCache()
        };
        const stricter = BUILT_IN_PROFILES.map((p) => ({
          ...p,
          levels: {
            standard: p.levels.standard * 1.1,
            key: p.levels.key * 1.1,
            safety: p.levels.safety * 1.1
          }
        }));
        // From scratch: a read model and plan of its own, so nothing kept for A or B is touched.
        const fresh = (r: PortfolioRecords, profiles: readonly ContextProfile[]) =>
          rankPortfolio({ ...r, processes: [...r.processes], studies: [...r.studies] }, profiles, {
            ...options,
            cache: new WindowFiguresCache()
          });
        const rankedA = rankedPortfolio(records, BUILT_IN_PROFILES, options);
        expect(rankPortfolio(b, BUILT_IN_PROFILES, options)).toEqual(fresh(b, BUILT_IN_PROFILES));
        // A's earlier ranking builds its rows from what it judged, with A's own figures.
        expect(Array.from(rankedA.order, (p) => rankedA.rowAt(p))).toEqual(fresh(records, BUILT_IN_PROFILES));
        // Each judged again under other targets, in turn.
        expect(rankPortfolio(b, stricter, options)).toEqual(fresh(b, stricter));
        expect(rankPortfolio(records, stricter, options)).toEqual(fresh(records, stricter));
        expect(rankPortfolio(b, BUILT_IN_PROFILES, options)).toEqual(fresh(b, BUILT_IN_PROFILES));
      }),
      { numRuns: 80, seed: 20261206 }
    );
  });

  it('ranks a read model written between rankings as a fresh one: what a ranking keeps never outlives a write', () => {
    // As the app's workers hold them: one record set whose read model takes each write in place. Plans,
    // prepared windows, judged rows and kept standings are found by the model's version; ranked after every
    // batch, each ranking must equal one of a model built afresh from the studies written so far.
    fc.assert(
      fc.property(
        portfolioArb,
        fc.integer({ min: 1, max: 6 }),
        fc.integer({ min: 2, max: 14 }),
        (records, step, end) => {
          const model = new MonthlyStatistics();
          const live: PortfolioRecords = { ...records, studies: [], statistics: model };
          const options = {
            endPeriod: MONTHS[end]!,
            windowMonths: 3,
            trendMonths: 6,
            cache: new WindowFiguresCache()
          };
          const quarter = { ...options, trendMonths: 0 };
          for (let i = 0; i < records.studies.length;) {
            const batch = records.studies.slice(i, (i += step));
            model.putAll(batch);
            if (model.needsRebuild) return;
            // Arrays of its own: nothing the live record set's rankings kept is found for it.
            const written: PortfolioRecords = {
              sites: [...records.sites],
              processes: [...records.processes],
              characteristics: [...records.characteristics],
              projects: [...records.projects],
              studies: records.studies.slice(0, i)
            };
            const fresh = { ...options, cache: new WindowFiguresCache() };
            expect(rankPortfolio(live, BUILT_IN_PROFILES, options)).toEqual(
              rankPortfolio(written, BUILT_IN_PROFILES, fresh)
            );
            expect(portfolioStandings(live, BUILT_IN_PROFILES, quarter)).toEqual(
              portfolioStandings(written, BUILT_IN_PROFILES, { ...quarter, cache: new WindowFiguresCache() })
            );
          }
        }
      ),
      { numRuns: 60, seed: 20261203 }
    );
  });

  it('ranks without trend lines as with them, and gives each asked process the plain trend line (as the page asks)', () => {
    fc.assert(
      fc.property(
        portfolioArb,
        fc.integer({ min: 2, max: 14 }),
        fc.integer({ min: 0, max: 2 ** 31 }),
        (records, end, pick) => {
          const endPeriod = MONTHS[end]!;
          const plain = plainRanking(records, endPeriod, 3, 12);
          const options = { endPeriod, windowMonths: 3, cache: new WindowFiguresCache() };
          const full = rankPortfolio(records, BUILT_IN_PROFILES, options);
          const bare = rankPortfolio(records, BUILT_IN_PROFILES, { ...options, trendMonths: 0 });
          expect(bare.map((r) => r.process.id)).toEqual(full.map((r) => r.process.id));
          expectPlainFigures(bare, plain);
          for (const row of bare) expect([row.trend, row.trendSlope]).toEqual([[], undefined]);
          // Some of the processes, as rows come into view; an unknown id is left out.
          const asked = full.filter((_, i) => (pick >> (i % 31)) & 1).map((r) => r.process.id);
          const trends = processTrends(records, BUILT_IN_PROFILES, [...asked, 'no-such-process'], {
            endPeriod
          });
          expect([...trends.keys()].sort()).toEqual([...asked].sort());
          for (const row of full.filter((r) => trends.has(r.process.id))) {
            const t = trends.get(row.process.id)!;
            t.trend.forEach((z, i) => close(z, plain.get(row.process.id)!.trendPlain[i]));
            expect(t).toEqual({ trend: row.trend, trendSlope: row.trendSlope });
          }
          // The details and the CSV: the rows completed with their lines are the full ranking's rows.
          expect(withTrends(records, BUILT_IN_PROFILES, bare, { endPeriod })).toEqual(full);
        }
      ),
      { numRuns: 100, seed: 20261203 }
    );
  });

  it('re-judges after changes of targets, weights and order exactly as a ranking from scratch', () => {
    // A history of requests as the portfolio page sends them: one thing of one context changed (one risk class's
    // level, the reporting, the measure with levels in its unit), or only the weights or the order; some come
    // back to an earlier profile.
    const change = fc.oneof(
      fc.record({
        risk: fc.constantFrom<RiskClass>('standard', 'key', 'safety'),
        level: fc.double({ min: 0.5, max: 6, noNaN: true })
      }),
      fc.record({ reporting: fc.constantFrom<ContextProfile['reporting']>('long-term', 'short-term') }),
      fc.record({
        measure: fc.constantFrom<ContextProfile['measure']>('index', 'zLevel', 'ppm'),
        scale: fc.double({ min: 0.5, max: 2, noNaN: true })
      }),
      fc.constant(undefined)
    );
    const step = fc.record({
      context: fc.integer({ min: 0, max: BUILT_IN_PROFILES.length - 1 }),
      change,
      weights: fc.record({
        gap: fc.double({ min: 0, max: 3, noNaN: true }),
        cost: fc.double({ min: 0, max: 3, noNaN: true }),
        risk: fc.double({ min: 0, max: 3, noNaN: true }),
        confidence: fc.double({ min: 0, max: 3, noNaN: true })
      }),
      order: fc.constantFrom('priority', 'gap', 'cost', 'risk', 'confidence')
    });
    type Change =
      | { risk: RiskClass; level: number }
      | { reporting: ContextProfile['reporting'] }
      | { measure: ContextProfile['measure']; scale: number }
      | undefined;
    const changed = (p: ContextProfile, c: Change): ContextProfile => {
      if (!c) return p;
      if ('risk' in c) return { ...p, levels: { ...p.levels, [c.risk]: c.level } };
      if ('reporting' in c) return { ...p, reporting: c.reporting };
      const unit = { index: 1.33, zLevel: 4, ppm: 500 }[c.measure] * c.scale;
      return { ...p, measure: c.measure, levels: { standard: unit, key: unit * 1.1, safety: unit * 1.2 } };
    };
    fc.assert(
      fc.property(portfolioArb, fc.array(step, { minLength: 2, maxLength: 8 }), (records, steps) => {
        const options = { endPeriod: '2026-12', windowMonths: 3, cache: new WindowFiguresCache() };
        let profiles: readonly ContextProfile[] = BUILT_IN_PROFILES;
        for (const s of steps) {
          profiles = profiles.map((p, i) => (i === s.context ? changed(p, s.change) : p));
          const again = rankPortfolio(records, profiles, { ...options, weights: s.weights, order: s.order });
          // From scratch: a record set of its own (another read model), so nothing judged before is reused.
          const fresh = rankPortfolio({ ...records, studies: [...records.studies] }, profiles, {
            ...options,
            cache: new WindowFiguresCache(),
            weights: s.weights,
            order: s.order
          });
          expect(again).toEqual(fresh);
          // The page's list, built from the ranking's numbers without rows, shows the full rows' figures.
          const list = listColumnsOf(
            rankedPortfolio(records, profiles, { ...options, weights: s.weights, order: s.order })
          );
          expect(Array.from({ length: list.count }, (_, i) => listRowAt(list, i))).toEqual(
            again.map(listFiguresOf)
          );
        }
      }),
      { numRuns: 80, seed: 20261205 }
    );
  });

  it('gives the review the quarter headlines of plain rankings of each quarter', () => {
    fc.assert(
      fc.property(portfolioArb, (records) => {
        const figures = buildQuarterReview(records, BUILT_IN_PROFILES, {
          quarter: '2026-Q4',
          trendQuarters: 4
        });
        for (const point of figures.shareTrend) {
          const end = periodsOfQuarter(point.quarter)[2]!;
          const plain = [...plainRanking(records, end, 3, 3).values()];
          const reviewed = plain.filter((r) => r.status !== 'no recent data');
          const meeting = reviewed.filter((r) => r.status !== 'short').length;
          const shown = reviewed.filter((r) => r.status === 'meets, shown').length;
          expect(point.reviewed).toBe(reviewed.length);
          close(point.share, reviewed.length ? meeting / reviewed.length : undefined);
          close(point.shareShown, reviewed.length ? shown / reviewed.length : undefined);
        }
        const plainNow = [...plainRanking(records, '2026-12', 3, 3).values()];
        const cost = plainNow.reduce(
          (a, r) => a + (r.status !== 'no recent data' ? (r.costPerYear ?? 0) : 0),
          0
        );
        close(figures.headline.cost.find((c) => c.currency === 'EUR')?.perYear ?? 0, cost);
        // The year-ago headline, judged without rows: the plain computation's counts and cost, and the headline
        // of a full ranking's rows (its stale count included).
        const plainYearAgo = [...plainRanking(records, '2025-12', 3, 3).values()];
        const reviewedThen = plainYearAgo.filter((r) => r.status !== 'no recent data');
        expect([figures.yearAgo.reviewed, figures.yearAgo.meeting]).toEqual([
          reviewedThen.length,
          reviewedThen.filter((r) => r.status !== 'short').length
        ]);
        close(
          figures.yearAgo.cost.find((c) => c.currency === 'EUR')?.perYear ?? 0,
          reviewedThen.reduce((a, r) => a + (r.costPerYear ?? 0), 0)
        );
        // In the records' order, as the standings are: a cost summed in another order may differ in its last bit.
        const fullYearAgo = rankPortfolio(records, BUILT_IN_PROFILES, {
          endPeriod: '2025-12',
          windowMonths: 3
        });
        const position = new Map(records.processes.map((p, i) => [p.id, i]));
        fullYearAgo.sort((a, b) => position.get(a.process.id)! - position.get(b.process.id)!);
        expect(figures.yearAgo).toEqual(headlineOf('2025-Q4', fullYearAgo.map(standingOfRow)));
      }),
      { numRuns: 60, seed: 20261203 }
    );
  });
});
