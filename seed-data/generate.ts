/** Writes seed-data/demo-portfolio.json from the scenario. Run with `npm run seed`. */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { buildDemoPortfolio } from './build-demo-portfolio';

const target = fileURLToPath(new URL('./demo-portfolio.json', import.meta.url));
const portfolio = buildDemoPortfolio();
writeFileSync(target, `${JSON.stringify(portfolio)}\n`);
const r = portfolio.records;
console.log(
  `demo portfolio: ${r.sites.length} sites, ${r.processes.length} processes, ${r.characteristics.length} characteristics, ` +
    `${r.studies.length} studies, ${r.projects.length} projects -> seed-data/demo-portfolio.json`
);
