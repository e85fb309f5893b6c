import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { afterAll, describe, expect, it } from 'vitest';
import { projectAnalysis } from '../../src-main/project/project-analysis';
import { loadProject } from '../../src-main/project/project-store';
import { ProjectSession } from '../../src-main/services/project-session';
import { tempFolder } from '../project/temp-folder';
import { runCli } from './run-main';

// `tallywise export` through main(), in this process. Exit statuses are the
// command-line contract's (shared/cli-contract.md): 0 done, 2 bad usage.
// Demo data: invented, simulated.

const folder = tempFolder('tw-cli-export-');
afterAll(() => folder.remove());

describe('tallywise export', () => {
  it('--demo to a workbook: exit 0, the path printed, four sheets', async () => {
    const out = join(folder.dir, 'demo.xlsx');
    const r = await runCli('export', '--demo', '--out', out);
    expect(r.err).not.toMatch(/\n\s+at /);
    expect(r.status).toBe(0);
    expect(r.out).toBe(out);
    expect(existsSync(out)).toBe(true);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(out);
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Records', 'Analysis table', 'Changes', 'About']);
    expect(r.err).toMatch(/Exported Records, Analysis table, Changes, About: \d+ records \(\d+ kept, \d+ left out\), \d+ analysis rows\./);
  }, 120_000);

  it('--project to CSV: the records table on request, as many rows as the saved project has records', async () => {
    const session = new ProjectSession(folder.dir);
    const opened = await session.newFromDemo(true);
    const file = join(folder.dir, 'demo.tallywise');
    await session.save(file, opened.document);
    const out = join(folder.dir, 'records.csv');
    const r = await runCli('export', '--project', file, '--out', out, '--table', 'records');
    expect(r.status).toBe(0);
    const rows = Papa.parse<string[]>(readFileSync(out, 'utf8').replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data;
    const a = await projectAnalysis((await loadProject(file)).document);
    expect(rows).toHaveLength(a.cleaned.length + 1);
    expect(rows[0].slice(0, 3)).toEqual(['File', 'Sheet', 'Row']);
    // Without --table a CSV holds the analysis table.
    const out2 = join(folder.dir, 'analysis.csv');
    expect((await runCli('export', '--project', file, '--out', out2)).status).toBe(0);
    expect(Papa.parse<string[]>(readFileSync(out2, 'utf8').replace(/^\uFEFF/, ''), { skipEmptyLines: true }).data).toHaveLength(a.table.nrows + 1);
  }, 120_000);

  it('a bad --table is a usage error (2) naming the tables there are', async () => {
    const r = await runCli('export', '--demo', '--out', join(folder.dir, 'x.csv'), '--table', 'sites');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/--table takes one of records, analysis, changes, about, not "sites"/);
    expect(existsSync(join(folder.dir, 'x.csv'))).toBe(false);
  });

  it('other usage errors: no source, a file of another kind, --table with a workbook, an unreadable project', async () => {
    expect((await runCli('export', '--out', join(folder.dir, 'a.xlsx'))).err).toMatch(/Say what to export/);
    const ods = await runCli('export', '--demo', '--out', join(folder.dir, 'a.ods'));
    expect(ods.status).toBe(2);
    expect(ods.err).toMatch(/must end in \.xlsx .* or \.csv/);
    const both = await runCli('export', '--demo', '--out', join(folder.dir, 'a.xlsx'), '--table', 'records');
    expect(both.status).toBe(2);
    expect(both.err).toMatch(/--table goes with a \.csv file/);
    const missing = await runCli('export', '--project', join(folder.dir, 'none.tallywise'), '--out', join(folder.dir, 'a.xlsx'));
    expect(missing.status).toBe(2);
    expect(missing.err).toMatch(/none\.tallywise/);
    expect(missing.err).not.toMatch(/\n\s+at /);
  });

  it('is listed by help', async () => {
    const r = await runCli('help');
    expect(r.out).toMatch(/^ {2}export\s+Write a project's cleaned data/m);
    expect((await runCli('help', 'export')).out).toMatch(/--table/);
  });
});
