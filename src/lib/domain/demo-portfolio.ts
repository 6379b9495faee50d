import { addMonths, periodOf } from './period';
import type { Characteristic } from './characteristic';
import type { ImprovementProject } from './improvement-project';
import type { Process } from './process';
import type { RecordMeta } from './record-meta';
import type { Site } from './site';
import type { Study } from './study';

/**
 * The demo portfolio as the seed generator writes it: every record complete with its bookkeeping, so that
 * loading it gives the same ids on every device.
 */
export interface DemoPortfolio {
  kind: 'capstan-demo-portfolio';
  version: 1;
  seed: number;
  company: string;
  records: {
    sites: Site[];
    processes: Process[];
    characteristics: Characteristic[];
    studies: Study[];
    projects: ImprovementProject[];
  };
}

/**
 * The demo's sites, by id. Every demo record lies under one of them, so these five ids are how Capstan knows the
 * demo is loaded and what "remove the demo" takes away, without loading the demo file (a test checks them
 * against the file).
 */
export const DEMO_SITE_IDS: readonly string[] = [
  'ce0dd9aa-88cc-461a-8015-3a7456bc8648',
  '1425e0e9-bbd0-4996-9925-7981825b1fc2',
  '543ed1d5-4e2b-4689-842d-5ff1645e9ee3',
  'c1e2611d-9cb1-41e9-9031-a18b21920d9b',
  '94d61920-68e4-4c00-8e0f-5e9002239b6e'
];

/** Shifts a date-time `YYYY-MM-DDThh:mm…` by whole calendar months (day clamped to the month's length). */
function shiftTime(iso: string, months: number): string {
  const [datePart, timePart] = iso.split('T') as [string, string];
  return `${shiftDate(datePart, months)}T${timePart}`;
}

function shiftDate(date: string, months: number): string {
  const [y, m, d] = date.split('-').map(Number) as [number, number, number];
  const index = y * 12 + (m - 1) + months;
  const year = Math.floor(index / 12);
  const month = (index % 12) + 1;
  const day = Math.min(d, new Date(Date.UTC(year, month, 0)).getUTCDate());
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

/**
 * The demo dated from the day it is loaded: every month, date and time moved by the same whole number of months
 * so that its last month is the last complete month (UTC), and any time that would still lie after the start
 * of today is set to the start of today, so no stamp lies in the future. Two devices that load the demo on the
 * same day get identical records. Pure: `nowMs` is the loading device's clock.
 */
export function datedFromToday(demo: DemoPortfolio, nowMs: number): DemoPortfolio {
  const r = demo.records;
  let last = '';
  for (const s of r.studies) if (s.period > last) last = s.period;
  if (!last) return demo;
  const lastComplete = addMonths(periodOf(new Date(nowMs)), -1);
  const months = periodIndex(lastComplete) - periodIndex(last);
  const todayStart = new Date(Math.floor(nowMs / 86_400_000) * 86_400_000).toISOString();
  const time = (iso: string) => {
    const shifted = shiftTime(iso, months);
    return shifted > todayStart ? todayStart : shifted;
  };
  const meta = <T extends RecordMeta>(x: T): T => ({
    ...x,
    createdAt: time(x.createdAt),
    updatedAt: time(x.updatedAt),
    ...(x.deletedAt !== undefined ? { deletedAt: time(x.deletedAt) } : {})
  });
  return {
    ...demo,
    records: {
      sites: r.sites.map(meta),
      processes: r.processes.map(meta),
      characteristics: r.characteristics.map(meta),
      studies: r.studies.map((s) => ({ ...meta(s), period: addMonths(s.period, months) })),
      projects: r.projects.map((p) => ({
        ...meta(p),
        startDate: shiftDate(p.startDate, months),
        ...(p.targetDate !== undefined ? { targetDate: shiftDate(p.targetDate, months) } : {})
      }))
    }
  };
}

function periodIndex(period: string): number {
  return Number(period.slice(0, 4)) * 12 + Number(period.slice(5, 7)) - 1;
}
