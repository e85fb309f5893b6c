import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { splitBy, tableFromTexts } from '@shared/data/table';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { parseModelSpec } from '@shared/model/spec';
import { analyseTrend } from '@shared/trend/trend-analysis';
import { main } from '../../bin/cli/main';
import { writeDemoCsv } from '../../src-main/demo/write-workbooks';
import demoSpec from '../../resources/demo/trend-spec.json';
import { hasPoppler, pdfText } from './pdf-tools';
import { fixture, reference, tolerance } from './ships-report';

// `tallywise report` through main(), in this process (--jobs 0). The demo is
// our invented, seeded scenario: its true trends (src-shared/demo/truth.ts)
// are the outside check here; the slopes are the engine's own, recomputed.
const dir = mkdtempSync(join(tmpdir(), 'tw-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function run(...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const status = await main(argv, { out: (t) => out.push(t), err: (t) => err.push(t) });
  return { status, out: out.join('\n'), err: err.join('\n') };
}

const pct = (x: number) => `${x >= 0 ? '+' : ''}${(100 * x).toFixed(1)}%`;

describe('tallywise report --demo', () => {
  let r: Awaited<ReturnType<typeof run>>;
  let paths: string[];
  beforeAll(async () => {
    r = await run('report', '--demo', '--out', join(dir, 'demo'), '--jobs', '0', '--replicates', '20');
    paths = r.out.trim().split('\n');
  });

  it('writes one .pdf, one .html and one .xlsx and prints their paths, one a line; progress on stderr', () => {
    expect(r.status).toBe(0);
    expect(paths).toHaveLength(3);
    expect(paths.map((p) => p.slice(p.lastIndexOf('.')))).toEqual(['.pdf', '.html', '.xlsx']);
    for (const p of paths) expect(existsSync(p)).toBe(true);
    expect(r.err).toMatch(/Trend for species "common_toad"/);
    expect(r.err).toMatch(/bootstrap refits: 80 of 80/);
  });

  it.skipIf(!hasPoppler())("the PDF holds each species' slope as the engine computes it", async () => {
    const text = pdfText(paths[0]).replace(/\s+/g, ' ');
    const csv = Papa.parse<string[]>(writeDemoCsv({}).trim(), { skipEmptyLines: true }).data;
    const table = tableFromTexts(csv[0], csv.slice(1));
    const spec = parseModelSpec(demoSpec);
    for (const g of splitBy(table, 'species')) {
      const s = (await analyseTrend(g.table, spec)).slope;
      const label = DEMO_TRUTH.species.find((t) => t.key === g.key)!.label;
      expect(text).toContain(`${pct(s.perYear)} a season, limits ${pct(s.lower)} to ${pct(s.upper)}`);
      // The lead sentence says decline or increase only when the whole interval lies on that side.
      const said = s.upper < 0 ? `Counts of ${label} declined by` : s.lower > 0 ? `Counts of ${label} increased by` : `the fitted trend in counts of ${label} lies between`;
      expect(text).toContain(said);
      if (s.lower <= 0 && s.upper >= 0) expect(text).toContain('the data cannot tell decline from increase');
    }
    expect(text).toContain('Composite of 4 species');
    expect(text).toMatch(/Buckland, S\.T\./);
  });

  it("each species' true trend (truth.ts) lies within the limits the report gives", async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(paths[2]);
    const ws = wb.getWorksheet('Trend summary')!;
    for (const truth of DEMO_TRUTH.species) {
      const row = ws.getRows(2, DEMO_TRUTH.species.length)!.find((x) => x.getCell(1).value === truth.label)!;
      const [lower, upper] = [row.getCell(3).value as number, row.getCell(4).value as number];
      expect(lower, truth.key).toBeLessThanOrEqual(truth.annualChange);
      expect(upper, truth.key).toBeGreaterThanOrEqual(truth.annualChange);
    }
    expect(wb.getWorksheet('Composite')!.rowCount).toBeGreaterThan(DEMO_TRUTH.lastSeason - DEMO_TRUTH.firstSeason);
  });

  it('the HTML names the input with its SHA-256 and holds the spec', () => {
    const html = readFileSync(paths[1], 'utf8');
    expect(html).toMatch(/SHA-256 [0-9a-f]{64}/);
    expect(html).toContain('&quot;distribution&quot;: &quot;negbin&quot;');
    expect(html).toContain('Seed of the composite bootstrap: 1.');
  });
});

describe('tallywise report --data --spec', () => {
  it('reports one table: three files named after the data, indices of stats::glm on MASS::ships (R 4.2.2) in the workbook', async () => {
    const d = fixture.ships.data as Record<string, (string | number)[]>;
    const header = Object.keys(d);
    const csv = join(dir, 'ships.csv');
    writeFileSync(csv, [header.join(','), ...d.incidents.map((_v, i) => header.map((h) => String(d[h][i])).join(','))].join('\n'));
    const spec = join(dir, 'ships.json');
    writeFileSync(spec, JSON.stringify({ response: 'incidents', distribution: 'poisson', offsets: [{ column: 'service', log: true }], site: { column: 'type', effect: 'fixed' }, time: { column: 'year', trend: 'annual' } }));
    const r = await run('report', '--data', csv, '--spec', spec, '--out', join(dir, 'ships'));
    expect(r.status).toBe(0);
    const paths = r.out.trim().split('\n');
    expect(paths.map((p) => p.slice(p.lastIndexOf('/') + 1))).toEqual(['ships-trend-report.pdf', 'ships-trend-report.html', 'ships-trend-report.xlsx']);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(paths[2]);
    const ws = wb.getWorksheet('Indices')!;
    reference.indices.forEach((want, i) => {
      const got = ws.getRow(i + 2).getCell(3).value as number;
      expect(Math.abs(got - want.index) / want.index).toBeLessThan(tolerance.index);
    });
    expect(readFileSync(paths[1], 'utf8')).toContain('ships.csv (34 rows), SHA-256');
  });
});

describe('tallywise report: usage', () => {
  it('--project is not yet available (exit 2, a plain message)', async () => {
    const r = await run('report', '--project', 'x.twproj', '--out', dir);
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/--project is not yet available/);
    expect(r.err).not.toMatch(/\n\s+at /);
  });

  it('a missing --out or a mixed --demo --data is named', async () => {
    const a = await run('report', '--demo');
    expect(a.status).toBe(2);
    expect(a.err).toMatch(/--out/);
    const b = await run('report', '--demo', '--data', 'x.csv', '--out', dir);
    expect(b.status).toBe(2);
    expect(b.err).toMatch(/leave out --data/);
  });

  it('--by a column that is not there lists the columns', async () => {
    const csv = join(dir, 'tiny.csv');
    const spec = join(dir, 'tiny.json');
    writeFileSync(csv, 'count,year\n1,1\n2,2\n3,3\n');
    writeFileSync(spec, JSON.stringify({ response: 'count', distribution: 'poisson', time: { column: 'year', trend: 'linear' } }));
    const r = await run('report', '--data', csv, '--spec', spec, '--out', dir, '--by', 'species');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/no column "species".*"count", "year"/);
  });
});
