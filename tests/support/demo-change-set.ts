import demo from '../../seed-data/demo-portfolio.json';
import { datedFromToday } from '../../src/lib/domain/demo-portfolio';
import { parseDemoPortfolio } from '../../src/lib/domain/demo-portfolio-schema';
import { travelling } from '../../src/lib/domain/record-meta';
import type { HeaderInput } from '../../src/lib/exchange/exchange-file';

/**
 * The demo portfolio as an exchange file carries it: every record as it travels, dated as a device loading the
 * demo at `nowMs` would hold it (the committed file ends in the month it was generated, and readers refuse
 * clocks ahead of theirs).
 */
export function demoRecordSet(nowMs: number) {
  const { records } = datedFromToday(parseDemoPortfolio(demo), nowMs);
  return {
    contextProfiles: [],
    sites: records.sites.map(travelling),
    processes: records.processes.map(travelling),
    characteristics: records.characteristics.map(travelling),
    studies: records.studies.map(travelling),
    projects: records.projects.map(travelling),
    reviews: []
  };
}

/** The header of a test's exchange file, exported by a device named after the file. */
export function testFileHeader(name: string): HeaderInput {
  return {
    appVersion: 'test',
    exportedBy: { deviceId: `${name.replace(/[^a-z0-9-]/g, '-')}-device`, deviceName: name },
    exportedAt: '2026-12-01T00:00:00.000Z',
    scope: { kind: 'everything' as const }
  };
}
