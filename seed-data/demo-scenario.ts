/**
 * The invented scenario behind the demo portfolio: Orrin & Vale Group, a fictional company with five sites in
 * five industry contexts. Every name and figure here is made up for the demo; none describes a real plant.
 */
import type { DataKind, RiskClass } from '../src/lib/domain/characteristic';
import type { ProjectPhase } from '../src/lib/domain/improvement-project';

/** How a characteristic's monthly data are produced. */
export type Generator =
  | { shape: 'normal'; centre: number; sd: number }
  /** exp(N(log(median), logSd)) — right-skewed, positive (roughness, handling times). */
  | { shape: 'lognormal'; median: number; logSd: number }
  /** low + (high − low)·logistic(N(location, scale)) — bounded on both sides (moisture, percentages). */
  | { shape: 'bounded'; low: number; high: number; location: number; scale: number }
  /** Poisson counts used as a measured value (particles per wafer): coarse resolution on purpose. */
  | { shape: 'poisson-measure'; mean: number }
  | { shape: 'defectives'; units: [number, number]; rate: number }
  | { shape: 'defects'; units: [number, number]; opportunities: number; ratePerOpportunity: number };

export interface CharacteristicPlan {
  name: string;
  unit: string;
  dataKind: DataKind;
  lsl?: number;
  usl?: number;
  target?: number;
  riskClass: RiskClass;
  physicalMin?: number;
  /** How the site reports it: measured values, only a summary, or counts. */
  report: 'raw' | 'summary' | 'counts';
  /** Values per month, for raw and summary reporting. */
  sampleSize?: number;
  /** Subgroup size for raw data taken in subgroups. */
  subgroupSize?: number;
  decimals: number;
  generator: Generator;
}

export interface ProcessPlan {
  name: string;
  /** Lines or cells running the same process; each becomes a process of its own. */
  lines: string[];
  monthlyVolume: number;
  costPerDefective: number;
  characteristics: CharacteristicPlan[];
}

export interface SitePlan {
  name: string;
  region: string;
  timeZone: string;
  contextId: string;
  currency: string;
  lead: string;
  processOwners: string[];
  processes: ProcessPlan[];
}

export interface ProjectPlan {
  site: string;
  process: string;
  title: string;
  phase: ProjectPhase;
  owner: string;
  startPeriod: string;
  expectedAnnualSaving: number;
  /** From this month on, spread (or defect rate) is multiplied by this factor — the gain a Control-phase project holds. */
  effect?: { fromPeriod: string; factor: number };
}

export const COMPANY = 'Orrin & Vale Group (fictional)';
export const DEMO_SEED = 20_261_201;
export const FIRST_PERIOD = '2024-12';
export const MONTHS = 24;

export const SITES: SitePlan[] = [
  {
    name: 'North Ridge Machining',
    region: 'Central Europe',
    timeZone: 'Europe/Berlin',
    contextId: 'vehicle-parts',
    currency: 'EUR',
    lead: 'Jana Petrovic',
    processOwners: ['Lukas Feld', 'Ines Moraru', 'Tomas Brandl'],
    processes: [
      {
        name: 'Camshaft journal grinding',
        lines: ['line A', 'line B'],
        monthlyVolume: 38_000,
        costPerDefective: 14.5,
        characteristics: [
          {
            name: 'Journal diameter',
            unit: 'mm',
            dataKind: 'measured',
            lsl: 24.98,
            usl: 25.0,
            target: 24.99,
            riskClass: 'key',
            report: 'raw',
            sampleSize: 40,
            subgroupSize: 5,
            decimals: 4,
            generator: { shape: 'normal', centre: 24.9905, sd: 0.0027 }
          },
          {
            name: 'Surface roughness Ra',
            unit: 'µm',
            dataKind: 'measured',
            usl: 0.4,
            riskClass: 'standard',
            physicalMin: 0,
            report: 'raw',
            sampleSize: 30,
            decimals: 3,
            generator: { shape: 'lognormal', median: 0.19, logSd: 0.24 }
          }
        ]
      },
      {
        name: 'Brake caliper bore machining',
        lines: ['cell 1', 'cell 2'],
        monthlyVolume: 21_000,
        costPerDefective: 42,
        characteristics: [
          {
            name: 'Piston bore diameter',
            unit: 'mm',
            dataKind: 'measured',
            lsl: 42.0,
            usl: 42.039,
            target: 42.0195,
            riskClass: 'safety',
            report: 'raw',
            sampleSize: 50,
            subgroupSize: 5,
            decimals: 4,
            generator: { shape: 'normal', centre: 42.0215, sd: 0.0052 }
          }
        ]
      },
      {
        name: 'Wheel-hub bolt torque audit',
        lines: ['assembly 1'],
        monthlyVolume: 64_000,
        costPerDefective: 6.2,
        characteristics: [
          {
            name: 'Torque outside window',
            unit: 'bolts',
            dataKind: 'counted',
            riskClass: 'safety',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defectives', units: [1400, 2200], rate: 0.0016 }
          }
        ]
      },
      {
        name: 'Gearbox housing leak test',
        lines: ['test bench 1', 'test bench 2'],
        monthlyVolume: 9_500,
        costPerDefective: 118,
        characteristics: [
          {
            name: 'Housings failing leak test',
            unit: 'housings',
            dataKind: 'counted',
            riskClass: 'key',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defectives', units: [2300, 3100], rate: 0.0061 }
          },
          {
            name: 'Leak rate',
            unit: 'cm³/min',
            dataKind: 'measured',
            usl: 4.0,
            riskClass: 'key',
            physicalMin: 0,
            report: 'summary',
            sampleSize: 80,
            decimals: 3,
            generator: { shape: 'normal', centre: 2.3, sd: 0.46 }
          }
        ]
      }
    ]
  },
  {
    name: 'Lakeside Medical Assembly',
    region: 'North America',
    timeZone: 'America/Chicago',
    contextId: 'medical-devices',
    currency: 'USD',
    lead: 'Priya Raman',
    processOwners: ['Dale Whitcombe', 'Rosa Inglés', 'Kenji Arata'],
    processes: [
      {
        name: 'Catheter tip bonding',
        lines: ['bonder 1', 'bonder 2'],
        monthlyVolume: 52_000,
        costPerDefective: 23,
        characteristics: [
          {
            name: 'Bond pull strength',
            unit: 'N',
            dataKind: 'measured',
            lsl: 15,
            riskClass: 'safety',
            physicalMin: 0,
            report: 'raw',
            sampleSize: 32,
            decimals: 2,
            generator: { shape: 'normal', centre: 21.4, sd: 1.55 }
          }
        ]
      },
      {
        name: 'Syringe barrel moulding',
        lines: ['press 4', 'press 7'],
        monthlyVolume: 410_000,
        costPerDefective: 0.85,
        characteristics: [
          {
            name: 'Barrel inner diameter',
            unit: 'mm',
            dataKind: 'measured',
            lsl: 8.6,
            usl: 8.72,
            target: 8.66,
            riskClass: 'key',
            report: 'summary',
            sampleSize: 125,
            decimals: 4,
            generator: { shape: 'normal', centre: 8.667, sd: 0.0145 }
          },
          {
            name: 'Short shots',
            unit: 'barrels',
            dataKind: 'counted',
            riskClass: 'standard',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defectives', units: [18_000, 26_000], rate: 0.0009 }
          }
        ]
      },
      {
        name: 'Sterile pouch sealing',
        lines: ['sealer A'],
        monthlyVolume: 95_000,
        costPerDefective: 4.1,
        characteristics: [
          {
            name: 'Seal width',
            unit: 'mm',
            dataKind: 'measured',
            lsl: 6,
            usl: 10,
            target: 8,
            riskClass: 'safety',
            report: 'raw',
            sampleSize: 40,
            subgroupSize: 4,
            decimals: 2,
            generator: { shape: 'normal', centre: 8.3, sd: 0.52 }
          },
          {
            name: 'Seal defects (4 seams per pouch)',
            unit: 'seams',
            dataKind: 'counted',
            riskClass: 'key',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defects', units: [3000, 4200], opportunities: 4, ratePerOpportunity: 0.0004 }
          }
        ]
      },
      {
        name: 'Device label verification',
        lines: ['packing 1', 'packing 2'],
        monthlyVolume: 120_000,
        costPerDefective: 2.6,
        characteristics: [
          {
            name: 'Labels rejected by vision check',
            unit: 'labels',
            dataKind: 'counted',
            riskClass: 'key',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defectives', units: [9000, 14_000], rate: 0.0022 }
          }
        ]
      }
    ]
  },
  {
    name: 'Harbour Foods Filling',
    region: 'Western Europe',
    timeZone: 'Europe/Dublin',
    contextId: 'packaged-goods',
    currency: 'EUR',
    lead: 'Aoife Brennan',
    processOwners: ['Conor Walsh', 'Marta Kowal'],
    processes: [
      {
        name: 'Yoghurt cup filling',
        lines: ['filler 1', 'filler 2', 'filler 3'],
        monthlyVolume: 1_300_000,
        costPerDefective: 0.31,
        characteristics: [
          {
            name: 'Net fill weight',
            unit: 'g',
            dataKind: 'measured',
            lsl: 491,
            usl: 515,
            target: 503,
            riskClass: 'key',
            physicalMin: 0,
            report: 'raw',
            sampleSize: 60,
            subgroupSize: 6,
            decimals: 1,
            generator: { shape: 'normal', centre: 503.5, sd: 3.4 }
          }
        ]
      },
      {
        name: 'Sauce jar capping',
        lines: ['capper 2'],
        monthlyVolume: 420_000,
        costPerDefective: 0.9,
        characteristics: [
          {
            name: 'Cap removal torque',
            unit: 'N·m',
            dataKind: 'measured',
            lsl: 1.2,
            usl: 2.6,
            riskClass: 'standard',
            physicalMin: 0,
            report: 'raw',
            sampleSize: 36,
            decimals: 2,
            generator: { shape: 'lognormal', median: 1.75, logSd: 0.12 }
          }
        ]
      },
      {
        name: 'Oat bar baking',
        lines: ['oven 1', 'oven 2'],
        monthlyVolume: 680_000,
        costPerDefective: 0.22,
        characteristics: [
          {
            name: 'Moisture content',
            unit: '%',
            dataKind: 'measured',
            lsl: 8,
            usl: 12,
            riskClass: 'standard',
            physicalMin: 0,
            report: 'raw',
            sampleSize: 30,
            decimals: 2,
            generator: { shape: 'bounded', low: 6, high: 14, location: -0.05, scale: 0.33 }
          },
          {
            name: 'Bars broken at packing',
            unit: 'bars',
            dataKind: 'counted',
            riskClass: 'standard',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defectives', units: [12_000, 16_000], rate: 0.011 }
          }
        ]
      },
      {
        name: 'Carton date coding',
        lines: ['end of line'],
        monthlyVolume: 210_000,
        costPerDefective: 1.4,
        characteristics: [
          {
            name: 'Unreadable or missing codes',
            unit: 'cartons',
            dataKind: 'counted',
            riskClass: 'key',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defectives', units: [5000, 7000], rate: 0.0035 }
          }
        ]
      }
    ]
  },
  {
    name: 'Eastgate Service Centre',
    region: 'South Asia',
    timeZone: 'Asia/Kolkata',
    contextId: 'transactional-service',
    currency: 'INR',
    lead: 'Rohan Mehta',
    processOwners: ['Sneha Kulkarni', 'Arjun Pillai'],
    processes: [
      {
        name: 'Supplier invoice processing',
        lines: ['team North', 'team South'],
        monthlyVolume: 46_000,
        costPerDefective: 410,
        characteristics: [
          {
            name: 'Field errors (12 checked fields per invoice)',
            unit: 'fields',
            dataKind: 'counted',
            riskClass: 'standard',
            report: 'counts',
            decimals: 0,
            generator: {
              shape: 'defects',
              units: [2500, 3500],
              opportunities: 12,
              ratePerOpportunity: 0.0021
            }
          }
        ]
      },
      {
        name: 'Warranty claim handling',
        lines: ['desk 1'],
        monthlyVolume: 7_800,
        costPerDefective: 1_900,
        characteristics: [
          {
            name: 'Handling time',
            unit: 'h',
            dataKind: 'measured',
            usl: 48,
            riskClass: 'standard',
            physicalMin: 0,
            report: 'raw',
            sampleSize: 60,
            decimals: 1,
            generator: { shape: 'lognormal', median: 19, logSd: 0.38 }
          }
        ]
      },
      {
        name: 'Customer call resolution',
        lines: ['queue English', 'queue Hindi'],
        monthlyVolume: 62_000,
        costPerDefective: 260,
        characteristics: [
          {
            name: 'Calls not resolved at first contact',
            unit: 'calls',
            dataKind: 'counted',
            riskClass: 'standard',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defectives', units: [4000, 5500], rate: 0.071 }
          }
        ]
      },
      {
        name: 'Customer master-data updates',
        lines: ['back office'],
        monthlyVolume: 15_000,
        costPerDefective: 350,
        characteristics: [
          {
            name: 'Record errors (8 fields per update)',
            unit: 'fields',
            dataKind: 'counted',
            riskClass: 'key',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defects', units: [1800, 2400], opportunities: 8, ratePerOpportunity: 0.0042 }
          }
        ]
      }
    ]
  },
  {
    name: 'Summit Wafer Fab',
    region: 'East Asia',
    timeZone: 'Asia/Taipei',
    contextId: 'semiconductors',
    currency: 'USD',
    lead: 'Mei-Ling Chou',
    processOwners: ['Wei Han', 'Hsin-Yi Lo', 'Daniel Ko'],
    processes: [
      {
        name: 'Gate oxide growth',
        lines: ['tube 3', 'tube 5'],
        monthlyVolume: 14_000,
        costPerDefective: 640,
        characteristics: [
          {
            name: 'Oxide thickness',
            unit: 'Å',
            dataKind: 'measured',
            lsl: 92,
            usl: 108,
            target: 100,
            riskClass: 'key',
            report: 'raw',
            sampleSize: 45,
            subgroupSize: 9,
            decimals: 2,
            generator: { shape: 'normal', centre: 100.6, sd: 1.9 }
          }
        ]
      },
      {
        name: 'Metal line etch',
        lines: ['etcher E2'],
        monthlyVolume: 14_000,
        costPerDefective: 910,
        characteristics: [
          {
            name: 'Critical dimension',
            unit: 'nm',
            dataKind: 'measured',
            lsl: 42,
            usl: 48,
            target: 45,
            riskClass: 'key',
            report: 'raw',
            sampleSize: 50,
            subgroupSize: 5,
            decimals: 2,
            generator: { shape: 'normal', centre: 45.4, sd: 0.78 }
          },
          {
            name: 'Sidewall angle',
            unit: '°',
            dataKind: 'measured',
            lsl: 84,
            usl: 90,
            riskClass: 'standard',
            report: 'summary',
            sampleSize: 50,
            decimals: 2,
            generator: { shape: 'normal', centre: 87.2, sd: 0.71 }
          }
        ]
      },
      {
        name: 'Post-clean particle inspection',
        lines: ['scanner P1'],
        monthlyVolume: 14_000,
        costPerDefective: 220,
        characteristics: [
          {
            name: 'Particles above 60 nm per wafer',
            unit: 'particles',
            dataKind: 'measured',
            usl: 25,
            riskClass: 'standard',
            physicalMin: 0,
            report: 'raw',
            sampleSize: 40,
            decimals: 0,
            generator: { shape: 'poisson-measure', mean: 9 }
          }
        ]
      },
      {
        name: 'Wafer probe test',
        lines: ['prober bay'],
        monthlyVolume: 2_900_000,
        costPerDefective: 3.2,
        characteristics: [
          {
            name: 'Failing dies',
            unit: 'dies',
            dataKind: 'counted',
            riskClass: 'standard',
            report: 'counts',
            decimals: 0,
            generator: { shape: 'defectives', units: [180_000, 240_000], rate: 0.0125 }
          }
        ]
      }
    ]
  }
];

export const PROJECTS: ProjectPlan[] = [
  {
    site: 'North Ridge Machining',
    process: 'Brake caliper bore machining — cell 2',
    title: 'Stabilise bore size after tool change',
    phase: 'Control',
    owner: 'Ines Moraru',
    startPeriod: '2025-04',
    expectedAnnualSaving: 61_000,
    effect: { fromPeriod: '2025-11', factor: 0.7 }
  },
  {
    site: 'North Ridge Machining',
    process: 'Gearbox housing leak test — test bench 1',
    title: 'Reduce leak-test false rejects',
    phase: 'Analyze',
    owner: 'Tomas Brandl',
    startPeriod: '2026-07',
    expectedAnnualSaving: 48_000
  },
  {
    site: 'Lakeside Medical Assembly',
    process: 'Catheter tip bonding — bonder 2',
    title: 'Bond strength variation on bonder 2',
    phase: 'Improve',
    owner: 'Dale Whitcombe',
    startPeriod: '2026-02',
    expectedAnnualSaving: 95_000
  },
  {
    site: 'Harbour Foods Filling',
    process: 'Yoghurt cup filling — filler 3',
    title: 'Cut give-away on filler 3',
    phase: 'Control',
    owner: 'Conor Walsh',
    startPeriod: '2025-02',
    expectedAnnualSaving: 72_000,
    effect: { fromPeriod: '2025-08', factor: 0.65 }
  },
  {
    site: 'Harbour Foods Filling',
    process: 'Oat bar baking — oven 2',
    title: 'Fewer broken bars at the packer',
    phase: 'Measure',
    owner: 'Marta Kowal',
    startPeriod: '2026-09',
    expectedAnnualSaving: 18_000
  },
  {
    site: 'Eastgate Service Centre',
    process: 'Customer call resolution — queue Hindi',
    title: 'First-contact resolution for billing calls',
    phase: 'Control',
    owner: 'Sneha Kulkarni',
    startPeriod: '2025-06',
    expectedAnnualSaving: 5_400_000,
    effect: { fromPeriod: '2026-01', factor: 0.6 }
  },
  {
    site: 'Eastgate Service Centre',
    process: 'Supplier invoice processing — team South',
    title: 'Invoice field errors from scanned PDFs',
    phase: 'Define',
    owner: 'Arjun Pillai',
    startPeriod: '2026-10',
    expectedAnnualSaving: 2_100_000
  },
  {
    site: 'Summit Wafer Fab',
    process: 'Metal line etch — etcher E2',
    title: 'Centre the etch critical dimension',
    phase: 'Improve',
    owner: 'Hsin-Yi Lo',
    startPeriod: '2026-03',
    expectedAnnualSaving: 340_000
  }
];
