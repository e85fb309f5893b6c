import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../cli/run-main';
import { fixture, reference, tolerance } from './ships-report';

// `tallywise report --data` through main(), in this process.
const dir = mkdtempSync(join(tmpdir(), 'tw-report-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = runCli;

// report --demo (the demo project) and --project: test/report/report-project.test.ts.

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
