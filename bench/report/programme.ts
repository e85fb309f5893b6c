/**
 * Time and peak memory of a whole programme report made in this process:
 * a seeded negative-binomial programme of S species (invented: 40 sites x 15
 * seasons, normal site effects SD 0.5, theta 2, each species its own rate
 * between -6% and +4% a season), per species the trend, a Poisson and a
 * negative binomial model compared, the diagnostics and the data summary,
 * then the PDF, HTML and XLSX written to a temporary folder.
 *
 * The reference, timed first in the same process: one negative binomial fit
 * of one species. Prints seconds, the ratio to the reference, and the peak
 * resident memory; asserts nothing.
 *   node programme.mjs SPECIES
 */
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { tableFromTexts, splitBy, type DataTable } from '../../src-shared/data/table';
import { createRng, deriveSeed } from '../../src-shared/demo/prng';
import { sampleNegBinomial, sampleNormal } from '../../src-shared/demo/samplers';
import { fitModel } from '../../src-shared/engine/fit';
import { parseModelSpec } from '../../src-shared/model/spec';
import { buildTrendReport } from '../../src-shared/report/build';
import type { GroupTrend } from '../../src-shared/report/group-section';
import { groupReportParts } from '../../src-shared/report/group-parts';
import { decisionFlags } from '../../src-shared/trend/flags';
import { analyseTrend } from '../../src-shared/trend/trend-analysis';
import { writeReportFiles } from '../../src-main/report/write-report';

const SITES = 40;
const SEASONS = 15;
const SEED = 2026;

function simulate(species: number): DataTable {
  const rows: string[][] = [];
  for (let s = 0; s < species; s++) {
    const rng = createRng(deriveSeed(SEED, `species-${s}`));
    const rate = Math.log(1 - 0.06 + (0.1 * s) / Math.max(1, species - 1));
    const base = Math.log(3 + (s % 5));
    const site = Array.from({ length: SITES }, () => sampleNormal(rng, 0, 0.5));
    for (let i = 0; i < SITES; i++) {
      for (let t = 0; t < SEASONS; t++) {
        const minutes = 20 + Math.floor(20 * rng.uniform());
        const mu = Math.exp(base + rate * t + site[i] + Math.log(minutes / 30));
        rows.push([`sp${String(s + 1).padStart(2, '0')}`, `site${i + 1}`, String(2010 + t), String(sampleNegBinomial(rng, mu, 2)), String(minutes)]);
      }
    }
  }
  return tableFromTexts(['species', 'site', 'season', 'count', 'minutes'], rows);
}

const spec = parseModelSpec({
  response: 'count',
  distribution: 'negbin',
  predictors: [],
  offsets: [{ column: 'minutes', log: true }],
  site: { column: 'site', effect: 'fixed' },
  time: { column: 'season', trend: 'annual', base: 2010 },
});
const poisson = parseModelSpec({ ...spec, distribution: 'poisson' });

const species = Number(process.argv[2] ?? 4);
const table = simulate(species);
const groups = splitBy(table, 'species');

/** Wall and CPU seconds of a step (the machine may be shared: CPU seconds compare better). */
const clock = () => ({ wall: performance.now() / 1000, cpu: process.cpuUsage() });
const since = (c: ReturnType<typeof clock>) => {
  const cpu = process.cpuUsage(c.cpu);
  return { wall: performance.now() / 1000 - c.wall, cpu: (cpu.user + cpu.system) / 1e6 };
};

let c0 = clock();
fitModel(groups[0].table, spec);
const reference = since(c0);

c0 = clock();
const trends: GroupTrend[] = [];
for (const g of groups) {
  const result = await analyseTrend(g.table, spec);
  trends.push({ group: g.key, result, flags: decisionFlags(result.slope), ...groupReportParts(g.table, { label: 'Negative binomial', spec }, [{ label: 'Poisson', spec: poisson }]) });
}
const fitted = since(c0);
const doc = buildTrendReport({
  title: `Synthetic programme of ${species} species`,
  spec,
  groupColumn: 'species',
  groups: trends,
  provenance: { software: { name: 'Tallywise', version: 'bench' }, inputs: [], seeds: [{ what: 'the simulation', value: SEED }], createdAt: new Date().toISOString() },
});
const dir = mkdtempSync(join(tmpdir(), 'tw-bench-report-'));
const c1 = clock();
const paths = await writeReportFiles(doc, dir, 'report');
const writing = since(c1);
const pdfMb = statSync(paths.pdf).size / 2 ** 20;
rmSync(dir, { recursive: true, force: true });
const total = fitted.wall + writing.wall;
const totalCpu = fitted.cpu + writing.cpu;
const peakMb = process.resourceUsage().maxRSS / 1024;
const r = (x: number, d = 2) => +x.toFixed(d);
console.log(
  JSON.stringify({
    species,
    records: table.nrows,
    referenceFitS: r(reference.wall, 3),
    referenceFitCpuS: r(reference.cpu, 3),
    modelsS: r(fitted.wall),
    documentsS: r(writing.wall),
    totalS: r(total),
    totalCpuS: r(totalCpu),
    cpuOverReference: r(totalCpu / reference.cpu, 1),
    pdfMb: r(pdfMb, 1),
    peakRssMb: Math.round(peakMb),
  }),
);
