import { createHash } from 'node:crypto';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { importStages, type ImportStage, type JobProgress } from '@shared/host/contract';
import { dispatchHostCall } from '@shared/host/dispatch';
import { createHostServices } from '../../src-main/services/host-services';
import { readWorkbook } from '../../src-main/services/record-import';
import type { ImportProgress } from '../../src-main/services/import-progress';
import { writeVisitWorkbook } from './visit-workbook';

/**
 * An import reports its stages in order up to the end, and a cancel at any
 * stage rejects with the named error and keeps nothing. The workbook is
 * invented data written with exceljs (visit-workbook.ts): a sheet of visits
 * and a sheet listing the sites.
 */
const VISIT_ROWS = 15_000;
const SITES = 300;
const roles = { site: 'Site', date: 'Date', visit: 'Visit', observer: 'Observer', effort: 'Minutes', effortUnit: 'minutes' as const, speciesColumns: ['Newt', 'Toad'] };

let dir: string;
let file: string;
let sourceId: string;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tw-import-progress-'));
  file = join(dir, 'visits.xlsx');
  await writeVisitWorkbook(file, VISIT_ROWS, SITES);
  // A source's id is the first 12 hex digits of its file's SHA-256 (the project's rule, see record-import.ts).
  sourceId = createHash('sha256').update(await readFile(file)).digest('hex').slice(0, 12);
}, 120_000);
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

function services(progress?: (e: JobProgress) => void) {
  const dialogs = { chooseOpen: async () => null, chooseSave: async () => null };
  return createHostServices({ appName: 'Tallywise', appVersion: 'test', platform: process.platform, userDataDir: dir, dialogs, shell: { reveal: async () => true }, progress });
}

describe('import progress', () => {
  it('reports every stage in order, the sheets as n of m with their rows, and reaches the end', async () => {
    const events: ImportProgress[] = [];
    const reading = await readWorkbook(file, { roles, onProgress: (e) => events.push(e) });
    expect(reading.data?.loaded.records.n).toBe(VISIT_ROWS * 2);

    const order = (s: ImportStage) => importStages.indexOf(s);
    for (let i = 1; i < events.length; i++) {
      expect(order(events[i].stage), `${events[i - 1].stage} then ${events[i].stage}`).toBeGreaterThanOrEqual(order(events[i - 1].stage));
      expect(events[i].fraction).toBeGreaterThanOrEqual(events[i - 1].fraction);
    }
    expect(new Set(events.map((e) => e.stage))).toEqual(new Set(importStages));
    expect(events[events.length - 1]).toMatchObject({ stage: 'done', fraction: 1 });

    const visits = events.filter((e) => e.sheet === 'Visits');
    const sites = events.filter((e) => e.sheet === 'Sites');
    // The visits sheet is several megabytes: it is read in more than one chunk, each reported.
    expect(visits.length).toBeGreaterThan(1);
    expect(visits.every((e) => e.sheetIndex === 1 && e.sheetCount === 2)).toBe(true);
    expect(sites.length).toBeGreaterThan(0);
    expect(sites.every((e) => e.sheetIndex === 2 && e.sheetCount === 2)).toBe(true);
    expect(events.findIndex((e) => e.sheet === 'Sites')).toBeGreaterThan(events.findLastIndex((e) => e.sheet === 'Visits'));
    // Rows read grow to the sheet's last spreadsheet row: the header plus the rows written above.
    for (let i = 1; i < visits.length; i++) expect(visits[i].rowsRead!).toBeGreaterThanOrEqual(visits[i - 1].rowsRead!);
    expect(visits[0].rowsRead!).toBeLessThan(VISIT_ROWS + 1);
    expect(visits[visits.length - 1].rowsRead).toBe(VISIT_ROWS + 1);
    expect(sites[sites.length - 1].rowsRead).toBe(SITES + 1);
  }, 60_000);

  // A cancel at each stage: the call rejects with the named error, and the host keeps none of the source's cells.
  for (const at of ['reading-sheet', 'checking', 'building', 'done'] as const) {
    it(`a cancel while ${at} rejects with ImportCancelled and keeps nothing`, async () => {
      const answers: boolean[] = [];
      let sent = false;
      const host = services((e) => {
        expect(e.jobId).toBe('job-1');
        if (e.stage === at && !sent) {
          sent = true;
          void dispatchHostCall(host, 'import:cancel', { jobId: 'job-1' }).then((r) => answers.push(r.ok && (r.value as { cancelled: boolean }).cancelled));
        }
      });
      const reply = await dispatchHostCall(host, 'import:read-workbook', { path: file, roles, jobId: 'job-1' });
      expect(reply).toMatchObject({ ok: false, error: { name: 'ImportCancelled', code: 'cancelled', message: expect.stringContaining('visits.xlsx') } });
      expect(answers).toEqual([true]);
      for (const sheet of ['Visits', 'Sites']) expect(await dispatchHostCall(host, 'project:sheet-cells', { sourceId, sheet })).toEqual({ ok: true, value: { grid: null } });
    }, 60_000);
  }

  it('a cancel for a job that is not running says so and stops nothing; the import then keeps its cells', async () => {
    const host = services();
    expect(await dispatchHostCall(host, 'import:cancel', { jobId: 'nothing-running' })).toEqual({ ok: true, value: { cancelled: false } });
    const reply = await dispatchHostCall(host, 'import:read-workbook', { path: file, roles, jobId: 'job-1' });
    expect(reply.ok).toBe(true);
    // The check the cancelled imports pass above can fail: a finished import is held.
    const kept = await dispatchHostCall(host, 'project:sheet-cells', { sourceId, sheet: 'Sites' });
    expect(kept.ok && (kept.value as { grid: unknown }).grid).not.toBeNull();
    expect(await dispatchHostCall(host, 'import:cancel', { jobId: 'job-1' })).toEqual({ ok: true, value: { cancelled: false } });
  }, 60_000);
});
