import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cleanedAnalysisOf } from '@shared/analysis/cleaned-analysis';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { findColumn, selectRows, type DataTable } from '@shared/data/table';
import { fitModel } from '@shared/engine/fit';
import { analyseTrend } from '@shared/trend/trend-analysis';
import type { ProjectDocument } from '@shared/project/document';
import { modelsOf, projectReportPlan, sourceInputs } from '@shared/report/programme-plan';
import { buildProgrammeReport } from '@shared/report/programme-report';
import { runCli } from '../cli/run-main';
import { demoProjectWithImports, type DemoProjectResult } from '../../src-main/demo/demo-project';
import { projectAnalysis, siteSheetOf } from '../../src-main/project/project-analysis';
import { saveProject } from '../../src-main/project/project-store';
import { projectPlan } from '../../src-main/report/project-report';
import { modelId, type FittedModel } from '../../src-renderer/src/views/models/fitted-model';
import { OUT_OF_DATE, reportChoices } from '../../src-renderer/src/views/report/report-choices';
import { hasPoppler, pdfText } from './pdf-tools';

// `tallywise report --project` and `--demo` through main(), in this process
// (--jobs 0). The demo is our invented, seeded scenario: its true trends
// (src-shared/demo/truth.ts) are the outside check of the numbers. The rest
// checks the messages and that the app's way to the report (the Report
// stage's choices on the Models stage's analysis table) and the command
// line's give the same numbers.
const dir = mkdtempSync(join(tmpdir(), 'tw-report-project-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = runCli;

let demo: DemoProjectResult;
let projectFile: string;
let species: string[];

beforeAll(async () => {
  demo = await demoProjectWithImports();
  projectFile = join(dir, 'ponds.tallywise');
  await saveProject(projectFile, demo.document);
  species = [...new Set(demo.document.models.map((m) => m.species))].sort();
}, 120_000);

const pct = (x: number) => `${x >= 0 ? '+' : ''}${(100 * x).toFixed(1)}%`;
const rowsWhere = (table: DataTable, sp: string) => findColumn(table, 'species')!.texts.flatMap((t, i) => (t === sp ? [i] : []));
const labelOf = (key: string) => DEMO_TRUTH.species.find((s) => s.key === key || s.label === key);

describe('tallywise report --demo', () => {
  let r: Awaited<ReturnType<typeof run>>;
  let paths: string[];
  beforeAll(async () => {
    r = await run('report', '--demo', '--out', join(dir, 'demo'), '--jobs', '0', '--replicates', '20');
    paths = r.out.trim().split('\n');
  }, 300_000);

  it('writes the three files of the demo project, with progress per species on stderr', () => {
    expect(r.err).not.toMatch(/\n\s+at /);
    expect(r.status).toBe(0);
    expect(paths.map((p) => p.slice(p.lastIndexOf('.')))).toEqual(['.pdf', '.html', '.xlsx']);
    for (const p of paths) expect(existsSync(p)).toBe(true);
    for (const s of species) expect(r.err).toContain(`Trend for species "${s}"`);
    expect(r.err).toMatch(/bootstrap refits: 80 of 80/);
  });

  it("each species' true trend (truth.ts) lies within the limits the report gives", async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(paths[2]);
    const ws = wb.getWorksheet('Trend summary')!;
    const rows = ws.getRows(2, species.length)!;
    for (const s of species) {
      const truth = labelOf(s)!;
      const row = rows.find((x) => x.getCell(1).value === s)!;
      expect(row, s).toBeDefined();
      expect(row.getCell(3).value as number, s).toBeLessThanOrEqual(truth.annualChange);
      expect(row.getCell(4).value as number, s).toBeGreaterThanOrEqual(truth.annualChange);
    }
  });

  it.skipIf(!hasPoppler())("the PDF holds each species' slope as the engine computes it from the project's table and chosen model", async () => {
    const text = pdfText(paths[0]).replace(/\s+/g, ' ');
    const { table } = await projectAnalysis(demo.document);
    for (const m of modelsOf(demo.document.models)) {
      const s = (await analyseTrend(selectRows(table, rowsWhere(table, m.species)), m.spec)).slope;
      expect(text).toContain(`${pct(s.perYear)} a season, limits ${pct(s.lower)} to ${pct(s.upper)}`);
    }
    expect(text).toContain('Zero-inflated negative binomial');
    expect(text).toContain(`Composite of ${species.length} species`);
    expect(text).toContain('invented, simulated data');
  });

  it('the HTML names the sources with their SHA-256, and holds the specs and the seeds', () => {
    const html = readFileSync(paths[1], 'utf8');
    expect(html).toMatch(/quillbrook-call-survey-2012\.xlsx, sheet &quot;Counts&quot; \(\d+ rows\), SHA-256 [0-9a-f]{64}/);
    expect(html).toContain('&quot;distribution&quot;: &quot;zinb&quot;');
    expect(html).toContain('Seed of the composite bootstrap: 1.');
    expect(html).toContain('Seed of the demo simulation:');
  });
});

describe('tallywise report --project', () => {
  it('reports the species asked for, and names the project file with its SHA-256 (computed here with node:crypto)', async () => {
    const r = await run('report', '--project', projectFile, '--out', join(dir, 'one'), '--species', species[0], '--jobs', '0');
    expect(r.err).not.toMatch(/\n\s+at /);
    expect(r.status).toBe(0);
    const html = readFileSync(r.out.trim().split('\n')[1], 'utf8');
    const sha = createHash('sha256').update(readFileSync(projectFile)).digest('hex');
    expect(html).toContain(`ponds.tallywise, SHA-256 ${sha}`);
    expect(html).toContain(species[0]);
    for (const s of species.slice(1)) expect(html).not.toContain(`Trend for ${s}`);
    expect(html).not.toContain('Composite of');
  }, 120_000);

  it('a species that is not in the project is named, with the species there are (exit 2)', async () => {
    const r = await run('report', '--project', projectFile, '--out', dir, '--species', 'Great bustard');
    expect(r.status).toBe(2);
    expect(r.err).toContain('"Great bustard" is not a species of the project');
    expect(r.err).toContain(`"${species[0]}"`);
  });

  async function withModels(name: string, change: (doc: ProjectDocument) => ProjectDocument): Promise<string> {
    const path = join(dir, name);
    await saveProject(path, change(structuredClone(demo.document)));
    return path;
  }

  it('a species with no chosen model is named, and the message says how to choose one in the app (exit 2)', async () => {
    const path = await withModels('unchosen.tallywise', (d) => ({ ...d, models: d.models.map((m) => (m.species === species[1] ? { ...m, chosen: false } : m)) }));
    const r = await run('report', '--project', path, '--out', dir);
    expect(r.status).toBe(2);
    expect(r.err).toContain(`"${species[1]}": no model is chosen for the report`);
    expect(r.err).toMatch(/Models stage.*"For the report"/);
    expect(existsSync(join(dir, 'unchosen'))).toBe(false);
  });

  it('a chosen model without a time term is named (exit 2)', async () => {
    const path = await withModels('no-time.tallywise', (d) => ({ ...d, models: d.models.map((m) => (m.species === species[0] && m.chosen ? { ...m, spec: { ...m.spec, time: undefined } } : m)) }));
    const r = await run('report', '--project', path, '--out', dir);
    expect(r.status).toBe(2);
    expect(r.err).toMatch(new RegExp(`"${species[0]}": the chosen model ".+" has no time term`));
  });

  it('a missing or foreign file is named, with no stack trace (exit 2)', async () => {
    const a = await run('report', '--project', join(dir, 'nothing.tallywise'), '--out', dir);
    expect(a.status).toBe(2);
    expect(a.err).toMatch(/"nothing\.tallywise" cannot be opened: there is no such file/);
    const foreign = join(dir, 'notes.tallywise');
    writeFileSync(foreign, 'just some text\n');
    const b = await run('report', '--project', foreign, '--out', dir);
    expect(b.status).toBe(2);
    expect(b.err).toMatch(/"notes\.tallywise" is not a Tallywise project file/);
    expect(`${a.err}${b.err}`).not.toMatch(/\n\s+at /);
  });

  it('--project with --data, or with --spec, is refused with the reason', async () => {
    const a = await run('report', '--project', projectFile, '--data', 'x.csv', '--out', dir);
    expect(a.status).toBe(2);
    expect(a.err).toMatch(/cannot go together: leave out --data/);
    const b = await run('report', '--project', projectFile, '--spec', 'x.json', '--out', dir);
    expect(b.status).toBe(2);
    expect(b.err).toMatch(/leave out --spec/);
  });
});

describe('the app and the command line give the same numbers for the same project', () => {
  it('the Report stage (its choices on the Models stage analysis) and report --project build equal tables', async () => {
    const doc = demo.document;
    const common = { projectFile: { name: 'ponds.tallywise', sha256: '0'.repeat(64) }, software: { name: 'Tallywise', version: 'test' }, createdAt: '2026-12-01T00:00:00.000Z', replicates: 20 };
    const cli = (await projectPlan(doc, common)).plan;
    // The app: the analysis the Models stage makes from the loaded sources, models fitted there and chosen per species.
    const loaded = demo.imports.map((i) => i.loaded);
    const input = cleanedAnalysisOf(loaded, doc.cleaning, siteSheetOf(doc));
    const chosen = modelsOf(doc.models);
    const candidates = modelsOf(doc.models, 'all');
    const fitted: FittedModel[] = candidates.map((m) => {
      const rows = cli.groups.find((g) => g.group === m.species)!.table;
      return { id: modelId(m.species, m.spec), species: m.species, spec: m.spec, label: m.name, table: rows, outcome: fitModel(rows, m.spec), dataKey: input.dataKey, fittedAt: 0, dropBadOffsetRows: m.dropBadOffsetRows };
    });
    const forReport = Object.fromEntries(chosen.map((m) => [m.species, modelId(m.species, m.spec)]));
    const choices = reportChoices(input.analysis.table, fitted, forReport, input.dataKey);
    expect(choices.choices.every((c) => c.problem === null)).toBe(true);
    const app = projectReportPlan({ ...common, programme: doc.programme.name, table: input.analysis.table, chosen: choices.chosen, candidates: choices.candidates, cleaning: doc.cleaning, cleaningRecords: input, species: doc.report.species, sources: sourceInputs(loaded) });
    // A model fitted before the cleaned records changed is out of date: the Report stage leaves its species out and says why.
    const stale = reportChoices(input.analysis.table, fitted.map((f) => (f.species === species[0] ? { ...f, dataKey: 'older' } : f)), forReport, input.dataKey);
    expect(stale.chosen.map((m) => m.species)).not.toContain(species[0]);
    expect(stale.choices.find((x) => x.species === species[0])?.problem).toBe(OUT_OF_DATE);
    const [a, c] = await Promise.all([buildProgrammeReport(app), buildProgrammeReport(cli)]);
    expect(a.sheets.map((s) => s.name)).toEqual(expect.arrayContaining(['Trend summary', 'Indices', 'Coefficients', 'Model comparison', 'Data summary', 'Audit log', 'Composite']));
    expect(a.sheets).toEqual(c.sheets);
    expect(a.appendix).toEqual(c.appendix);
  }, 300_000);
});
