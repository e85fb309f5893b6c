import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ProjectDocument } from '@shared/project/document';
import { historyEntry } from '@shared/report/history-record';
import { runProgrammeReport } from '@shared/report/programme-report';
import { demoProject } from '../../src-main/demo/demo-project';
import { loadProject, saveProject } from '../../src-main/project/project-store';
import { fileFingerprint, projectPlan } from '../../src-main/report/project-report';
import { writeReportFiles } from '../../src-main/report/write-report';
import { runCli } from './run-main';

// `tallywise report --project FILE --verify` through main(), in this
// process (--jobs 0). The project is the demo (our invented, simulated
// scenario) with one report in its history, made the way the app makes it:
// the shared run, the files written, their SHA-256, the entry appended.

const dir = mkdtempSync(join(tmpdir(), 'tw-report-verify-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const SPECIES = 'Common toad,Pool frog';
const project = join(dir, 'ponds.tallywise');
const tampered = join(dir, 'ponds-tampered.tallywise');
let doc: ProjectDocument;

beforeAll(async () => {
  const demo = await demoProject();
  const { plan } = await projectPlan(demo, { species: SPECIES.split(','), projectFile: null, software: { name: 'Tallywise', version: 'test' }, createdAt: '2026-03-01T10:00:00.000Z', replicates: 20 });
  const run = await runProgrammeReport(plan);
  const written = await writeReportFiles(run.document, join(dir, 'first'), 'ponds-trend-report');
  const files = await Promise.all([written.pdf, written.html, written.xlsx].map(fileFingerprint));
  doc = { ...demo, reportHistory: [historyEntry(run.record, files)] };
  await saveProject(project, doc);
  const copy = structuredClone(doc);
  copy.reportHistory[0].species[0].result!.trend.perSeason! += 0.001;
  await saveProject(tampered, copy);
}, 300_000);

const verify = (file: string, out: string) => runCli('report', '--project', file, '--out', join(dir, out), '--species', SPECIES, '--replicates', '20', '--jobs', '0', '--verify');

describe('tallywise report --verify', () => {
  it('an unchanged project: "reproduced exactly", exit 0, the section in the report, the project file not written', async () => {
    const before = readFileSync(project);
    const r = await verify(project, 'again');
    expect(r.err).not.toMatch(/\n\s+at /);
    const lines = r.out.trim().split('\n');
    expect(lines.slice(0, 3).map((p) => p.slice(p.lastIndexOf('.')))).toEqual(['.pdf', '.html', '.xlsx']);
    expect(lines[3]).toBe('reproduced exactly');
    expect(r.status).toBe(0);
    const html = readFileSync(lines[1], 'utf8');
    expect(html).toContain('<h2>Since the last report</h2>');
    expect(html).toMatch(/The last report was made on 2026-03-01 10:00 UTC with Tallywise test\..*reproduced exactly\./);
    expect(html).toContain(`${doc.reportHistory[0].files[0].name} (SHA-256 ${doc.reportHistory[0].files[0].sha256.slice(0, 12)}`);
    expect(Buffer.compare(readFileSync(project), before)).toBe(0);
    expect((await loadProject(project)).document.reportHistory).toHaveLength(1);
  }, 300_000);

  it('stored numbers tampered with: exit 1, naming the species and the quantity', async () => {
    const r = await verify(tampered, 'tampered');
    expect(r.status).toBe(1);
    const stored = doc.reportHistory[0].species[0].result!.trend.perSeason!;
    expect(r.out).toMatch(/not reproduced: the cleaned records and the models are the same as in the report of 2026-03-01 10:00 UTC \(Tallywise test\), yet one number differs:/);
    expect(r.out).toContain(`  Common toad: trend a season was ${stored + 0.001}, is ${stored}`);
  }, 300_000);

  it('--verify needs a project', async () => {
    const r = await runCli('report', '--demo', '--out', join(dir, 'demo'), '--verify');
    expect(r.status).toBe(2);
    expect(r.err).toMatch(/--verify goes with --project FILE/);
  });
});
