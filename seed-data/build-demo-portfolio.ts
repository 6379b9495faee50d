/**
 * Builds the demo portfolio from the scenario, deterministically: the same seed gives byte-identical output.
 * Per characteristic, the mean wanders month to month (a damped random walk with an occasional step), so
 * the demo has processes that drift, processes that hold, and a few Control-phase projects whose gain shows.
 */
import type { Characteristic } from '../src/lib/domain/characteristic';
import type { DemoPortfolio } from '../src/lib/domain/demo-portfolio';
import type { ImprovementProject } from '../src/lib/domain/improvement-project';
import { addMonths } from '../src/lib/domain/period';
import type { Process } from '../src/lib/domain/process';
import type { RecordMeta } from '../src/lib/domain/record-meta';
import type { Site } from '../src/lib/domain/site';
import type { Study, StudyData } from '../src/lib/domain/study';
import {
  COMPANY,
  DEMO_SEED,
  FIRST_PERIOD,
  MONTHS,
  PROJECTS,
  SITES,
  type CharacteristicPlan,
  type Generator
} from './demo-scenario';
import { SeededRandom } from './seeded-random';

const SETUP_TIME = '2024-11-18T08:30:00.000Z';

function round(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor;
}

function meta(rng: SeededRandom, deviceId: string, at: string): RecordMeta {
  return { id: rng.uuid(), createdAt: at, updatedAt: at, rev: 1, deviceId };
}

/** When a month's study was entered: a few days after the month ends, in working hours UTC. */
function entryTime(rng: SeededRandom, period: string): string {
  const next = addMonths(period, 1);
  const day = String(rng.integer(2, 9)).padStart(2, '0');
  const hour = String(rng.integer(6, 15)).padStart(2, '0');
  const minute = String(rng.integer(0, 59)).padStart(2, '0');
  return `${next}-${day}T${hour}:${minute}:00.000Z`;
}

/** Month-to-month state of one characteristic: mean offset in units of its spread, and a spread factor. */
interface Drift {
  offset: number;
  spread: number;
}

function advanceDrift(rng: SeededRandom, drift: Drift): Drift {
  let offset = 0.75 * drift.offset + 0.28 * rng.normal();
  if (rng.next() < 0.04) offset += rng.pick([-1.1, 1.1]);
  const spread = Math.max(0.7, Math.min(1.5, drift.spread * (1 + 0.05 * rng.normal())));
  return { offset, spread };
}

function measuredValue(rng: SeededRandom, g: Generator, drift: Drift, gain: number): number {
  switch (g.shape) {
    case 'normal':
      return g.centre + g.sd * drift.offset * 0.6 + g.sd * drift.spread * gain * rng.normal();
    case 'lognormal':
      return (
        g.median * Math.exp(0.25 * g.logSd * drift.offset + g.logSd * drift.spread * gain * rng.normal())
      );
    case 'bounded': {
      const z = g.location + 0.3 * g.scale * drift.offset + g.scale * drift.spread * gain * rng.normal();
      return g.low + (g.high - g.low) / (1 + Math.exp(-z));
    }
    case 'poisson-measure':
      return rng.poisson(g.mean * Math.exp(0.1 * drift.offset) * gain);
    default:
      throw new Error(`measuredValue: generator '${g.shape}' is for counted data`);
  }
}

function sampleMeanSd(values: number[]): { mean: number; sd: number } {
  const mean = values.reduce((a, b) => a + b, 0) / values.length;
  const ss = values.reduce((a, b) => a + (b - mean) ** 2, 0);
  return { mean, sd: Math.sqrt(ss / (values.length - 1)) };
}

function studyData(
  rng: SeededRandom,
  plan: CharacteristicPlan,
  drift: Drift,
  gain: number,
  period: string
): StudyData {
  const g = plan.generator;
  if (g.shape === 'defectives') {
    const units = rng.integer(g.units[0], g.units[1]);
    const rate = g.rate * Math.exp(0.25 * drift.offset) * gain;
    return { kind: 'defectives', units, defectives: Math.min(units, rng.poisson(units * rate)) };
  }
  if (g.shape === 'defects') {
    const units = rng.integer(g.units[0], g.units[1]);
    const rate = g.ratePerOpportunity * Math.exp(0.25 * drift.offset) * gain;
    const max = units * g.opportunities;
    return {
      kind: 'defects',
      units,
      opportunitiesPerUnit: g.opportunities,
      defects: Math.min(max, rng.poisson(max * rate))
    };
  }
  const n = plan.sampleSize ?? 30;
  const values = Array.from({ length: n }, () => round(measuredValue(rng, g, drift, gain), plan.decimals));
  if (plan.report === 'summary') {
    const { mean, sd } = sampleMeanSd(values);
    return { kind: 'summary', n, mean: round(mean, plan.decimals + 2), sd: round(sd, plan.decimals + 2) };
  }
  if (plan.subgroupSize) {
    const size = plan.subgroupSize;
    const subgroups = values.map((_, i) => `${period}/${String(Math.floor(i / size) + 1).padStart(2, '0')}`);
    return { kind: 'raw', values, subgroups };
  }
  return { kind: 'raw', values };
}

export function buildDemoPortfolio(seed: number = DEMO_SEED): DemoPortfolio {
  const rng = new SeededRandom(seed);
  const sites: Site[] = [];
  const processes: Process[] = [];
  const characteristics: Characteristic[] = [];
  const studies: Study[] = [];
  const projects: ImprovementProject[] = [];
  const processByName = new Map<string, Process>();
  const lastPeriod = addMonths(FIRST_PERIOD, MONTHS - 1);

  for (const sitePlan of SITES) {
    // Each site lead enters data on a device of their own.
    const leadDevice = rng.uuid();
    const site: Site = {
      ...meta(rng, leadDevice, SETUP_TIME),
      name: sitePlan.name,
      region: sitePlan.region,
      timeZone: sitePlan.timeZone
    };
    sites.push(site);
    let ownerIndex = 0;
    for (const processPlan of sitePlan.processes) {
      for (const line of processPlan.lines) {
        const owner = sitePlan.processOwners[ownerIndex % sitePlan.processOwners.length] as string;
        ownerIndex += 1;
        const process: Process = {
          ...meta(rng, leadDevice, SETUP_TIME),
          siteId: site.id,
          name: `${processPlan.name} — ${line}`,
          owner,
          contextId: sitePlan.contextId,
          monthlyVolume: Math.round(processPlan.monthlyVolume * rng.between(0.8, 1.2)),
          costPerDefective: processPlan.costPerDefective,
          currency: sitePlan.currency
        };
        processes.push(process);
        processByName.set(`${sitePlan.name}|${process.name}`, process);
        const project = PROJECTS.find((p) => p.site === sitePlan.name && p.process === process.name);

        for (const plan of processPlan.characteristics) {
          const characteristic: Characteristic = {
            ...meta(rng, leadDevice, SETUP_TIME),
            processId: process.id,
            name: plan.name,
            unit: plan.unit,
            dataKind: plan.dataKind,
            riskClass: plan.riskClass,
            ...(plan.lsl !== undefined ? { lsl: plan.lsl } : {}),
            ...(plan.usl !== undefined ? { usl: plan.usl } : {}),
            ...(plan.target !== undefined ? { target: plan.target } : {}),
            ...(plan.physicalMin !== undefined ? { physicalMin: plan.physicalMin } : {}),
            // A counted characteristic says what it counts, so that a new month's entry starts on it (with the
            // opportunities per unit its name promises, not 1).
            ...(plan.generator.shape === 'defects'
              ? { countedAs: 'defects' as const, opportunitiesPerUnit: plan.generator.opportunities }
              : plan.generator.shape === 'defectives'
                ? { countedAs: 'defectives' as const }
                : {})
          };
          characteristics.push(characteristic);

          let drift: Drift = { offset: rng.normal() * 0.5, spread: rng.between(0.85, 1.25) };
          for (let m = 0; m < MONTHS; m += 1) {
            const period = addMonths(FIRST_PERIOD, m);
            drift = advanceDrift(rng, drift);
            // Some months go unreported; the last month is still being logged at two of the sites.
            const lateSite =
              sitePlan.name === 'Lakeside Medical Assembly' || sitePlan.name === 'Eastgate Service Centre';
            const missing = rng.next() < 0.03 || (period === lastPeriod && lateSite && rng.next() < 0.6);
            if (missing) continue;
            const gain = project?.effect && period >= project.effect.fromPeriod ? project.effect.factor : 1;
            const at = entryTime(rng, period);
            studies.push({
              ...meta(rng, leadDevice, at),
              characteristicId: characteristic.id,
              period,
              data: studyData(rng, plan, drift, gain, period),
              enteredBy: sitePlan.lead
            });
          }
        }
      }
    }
  }

  for (const plan of PROJECTS) {
    const process = processByName.get(`${plan.site}|${plan.process}`);
    if (!process)
      throw new Error(`Demo scenario: project '${plan.title}' names an unknown process '${plan.process}'`);
    const at = `${plan.startPeriod}-03T09:00:00.000Z`;
    projects.push({
      ...meta(rng, process.deviceId, at),
      processId: process.id,
      title: plan.title,
      phase: plan.phase,
      owner: plan.owner,
      startDate: `${plan.startPeriod}-03`,
      targetDate: `${addMonths(plan.startPeriod, 9)}-28`,
      expectedAnnualSaving: plan.expectedAnnualSaving
    });
  }

  return {
    kind: 'capstan-demo-portfolio',
    version: 1,
    seed,
    company: COMPANY,
    records: { sites, processes, characteristics, studies, projects }
  };
}
