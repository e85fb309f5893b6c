import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { writeDemoWorkbooks, type DemoWorkbooksResult } from '../../src-main/demo/write-workbooks';
import { readWorkbook } from '../../src-main/services/record-import';
import { pageCodes } from '../../src-main/services/record-checks';
import { checkFile } from '../../src-main/import/check-file';
import { rolesToTemplate } from '@shared/import/roles-template';
import { ProjectSession } from '../../src-main/services/project-session';
import { createProjectDocument } from '@shared/project/document';
import { appendEdit } from '@shared/cleaning/edit-log';
import type { MessKind } from '@shared/demo/mess';
import { recordId, type LoadedSource } from '@shared/host/contract';
import { unpackColumn } from '../../src-renderer/src/views/records/unpack-columns';

/** The packed columns of a source, unpacked as the page does. */
function unpacked(loaded: LoadedSource) {
  const r = loaded.records;
  const sheet = unpackColumn(r.sheet, r.n) as string[];
  const row = unpackColumn(r.row, r.n) as number[];
  const column = unpackColumn(r.column, r.n) as string[];
  const ids = sheet.map((s, i) => recordId(r.sourceId, s, column[i], row[i]));
  const value = (f: string) => unpackColumn(r.values[f], r.n);
  return { ids, sheet, row, column, value };
}

// The services behind the Records stage, run in Node. What they must find is
// taken from the demo generator's own list of the problems it planted (where
// each is and what was written), not from our output.

/** Which finding code answers each planted problem. */
const expectedCode: Record<MessKind, string> = {
  'not-surveyed-code': 'count-not-surveyed',
  'present-not-counted-code': 'count-present-only',
  'at-least-code': 'count-lower-bound',
  'pond-name-variant': 'name-variant',
  'duplicated-row': 'repeated-visit',
  'missing-minutes': 'effort-missing',
  'count-as-text': 'count-as-text',
  'date-as-text': 'date-as-text',
};

let demo: DemoWorkbooksResult;
const dir = mkdtempSync(join(tmpdir(), 'tallywise-records-'));

beforeAll(async () => {
  demo = await writeDemoWorkbooks(join(dir, 'books'));
});

describe('importing a demo season workbook', () => {
  it('flags every planted problem at its sheet, row and column', async () => {
    const seasons = [...new Set(demo.planted.map((p) => p.season))];
    for (const season of seasons) {
      const file = demo.files.find((f) => f.endsWith(`-${season}.xlsx`))!;
      const reading = await readWorkbook(file);
      expect(reading.questions).toEqual([]);
      const findings = reading.data!.loaded.findings;
      for (const p of demo.planted.filter((x) => x.season === season)) {
        const hit = findings.find((f) => f.code === expectedCode[p.kind] && f.sheet === p.sheet && f.row === p.row && f.column === p.column);
        expect(hit, `${p.kind} at ${p.file} ${p.sheet}!${p.column}${p.row}`).toBeDefined();
        // The shared mapping trims site names as it reads them (src-shared/import/mapping.ts), so the variant is merged as trimmed.
        if (p.kind === 'pond-name-variant') expect(hit!.merge).toEqual({ field: 'site', from: p.found.trim(), into: p.cleanValue });
        if (p.kind === 'count-as-text') {
          const u = unpacked(reading.data!.loaded);
          const i = u.ids.indexOf(hit!.recordIds[0]);
          expect(i).toBeGreaterThanOrEqual(0);
          expect(u.value('count')[i]).toBe(p.cleanValue);
        }
        if (p.kind === 'date-as-text') expect(hit!.message).toContain(String(p.cleanValue));
      }
      // No name-variant or repeated-visit flag where none was planted (false alarms cost the analyst time).
      for (const code of ['name-variant', 'repeated-visit']) {
        const planted = demo.planted.filter((x) => x.season === season && expectedCode[x.kind] === code).length;
        expect(findings.filter((f) => f.code === code).length, `${code} in ${season}`).toBe(planted);
      }
    }
  });

  it('gives one record per pond visit and species, with the count cell as its place', async () => {
    const file = demo.files[0];
    const data = (await readWorkbook(file)).data!;
    const r = unpacked(data.loaded);
    const species = data.mapping.roles.speciesColumns!;
    expect(data.loaded.summary.mappedBy).toBe('demo-template');
    expect(r.ids.length).toBe(data.loaded.records.n);
    expect(r.ids.length % species.length).toBe(0);
    expect(new Set(r.ids).size).toBe(r.ids.length);
    expect(r.sheet.every((s) => s === 'Counts')).toBe(true);
    expect(Math.min(...r.row)).toBe(6); // first data row of the demo Counts sheet (season-sheet.ts layout)
    // Every finding names records that exist.
    const known = new Set(r.ids);
    expect(data.loaded.findings.flatMap((f) => f.recordIds).every((id) => known.has(id))).toBe(true);
  });

  it('reports the same findings as `tallywise check` given the same mapping', async () => {
    for (const season of [...new Set(demo.planted.map((p) => p.season))]) {
      const file = demo.files.find((f) => f.endsWith(`-${season}.xlsx`))!;
      const reading = await readWorkbook(file);
      const data = reading.data!;
      const templatePath = join(dir, `template-${season}.json`);
      writeFileSync(templatePath, JSON.stringify({ ...rolesToTemplate(data.mapping.roles, reading.headers, data.mapping.dateOrder), sheet: 'Counts' }));
      const report = await checkFile(file, { template: templatePath });
      const notes = new Set(data.loaded.summary.notes.map((n) => n.code));
      const fromCheck = report.findings.filter((f) => !notes.has(f.code)).map((f) => `${pageCodes[f.code] ?? f.code}|${f.severity}|${f.row}|${f.column}|${f.message}`);
      const fromApp = data.loaded.findings.map((f) => `${f.code}|${f.severity}|${f.row}|${f.column}|${f.message}`);
      expect(fromApp.length, `findings in ${season}`).toBeGreaterThan(0);
      expect([...fromApp].sort(), `findings in ${season}`).toEqual([...fromCheck].sort());
    }
  });

  it('names the file when it cannot be read', async () => {
    await expect(readWorkbook(join(dir, 'missing.xlsx'))).rejects.toMatchObject({ name: 'ImportError', message: expect.stringContaining('missing.xlsx') });
  });
});

describe('saving and opening a project', () => {
  it('redoes the import from the kept cells and keeps the cleaning log', async () => {
    const session = new ProjectSession(join(dir, 'user'), 10);
    const data = (await readWorkbook(demo.files[2])).data!;
    session.keep(data);
    const base = createProjectDocument('Test programme');
    const { sheets: _s, ...ref } = data.stored;
    void _s;
    const cleaning = appendEdit(base.cleaning, { kind: 'exclude', recordIds: [unpacked(data.loaded).ids[0]], reason: 'a test' });
    const saved = await session.save(join(dir, 'p1'), { ...base, sources: [ref], cleaning });
    expect(saved.path.endsWith('p1.tallywise')).toBe(true);
    const fresh = new ProjectSession(join(dir, 'user2'));
    const opened = await fresh.open(saved.path);
    expect(opened.name).toBe('p1');
    expect(opened.document.cleaning).toEqual(cleaning);
    expect(opened.sources[0].records).toEqual(data.loaded.records);
    expect(opened.sources[0].findings).toEqual(data.loaded.findings);
  });

  it('offers unsaved work kept in the recovery file, and opens it', async () => {
    const session = new ProjectSession(join(dir, 'user3'), 5);
    const data = (await readWorkbook(demo.files[1])).data!;
    session.keep(data);
    const { sheets: _s, ...ref } = data.stored;
    void _s;
    const base = createProjectDocument('Recovery test');
    const saved = await session.save(join(dir, 'p2.tallywise'), { ...base, sources: [ref] });
    expect(await session.checkRecovery(saved.path)).toBeNull();
    await new Promise((ok) => setTimeout(ok, 20));
    const cleaning = appendEdit(base.cleaning, { kind: 'merge-name', field: 'site', from: 'a', into: 'b' });
    await session.autosave(saved.path, { ...base, sources: [ref], cleaning });
    await session.flush();
    const offer = await session.checkRecovery(saved.path);
    expect(offer).toMatchObject({ programme: 'Recovery test', edits: 1 });
    const reopened = await new ProjectSession(join(dir, 'user4')).open(saved.path, true);
    expect(reopened.document.cleaning).toEqual(cleaning);
    expect(reopened.path).toBe(saved.path);
  });

  it('makes the demo project from every season workbook, each source with its own id', async () => {
    const session = new ProjectSession(join(dir, 'user6'));
    const opened = await session.newFromDemo();
    expect(opened.sources.map((s) => s.summary.fileName)).toEqual(demo.files.map((f) => f.replace(/^.*[\\/]/, '')));
    expect(opened.document.sources.map((s) => s.id)).toEqual(opened.sources.map((s) => s.summary.id));
    expect(new Set(opened.document.sources.map((s) => s.id)).size).toBe(demo.files.length);
    const flagged = opened.sources.flatMap((s) => s.findings.map((f) => `${s.summary.fileName}|${f.code}|${f.row}|${f.column}`));
    for (const p of demo.planted) expect(flagged, `${p.kind} in ${p.file}`).toContain(`${p.file}|${expectedCode[p.kind]}|${p.row}|${p.column}`);
  });

  it('refuses to save a source whose cells it does not hold, saying what to do', async () => {
    const session = new ProjectSession(join(dir, 'user5'));
    const base = createProjectDocument('X');
    const ref = { id: 'abc', fileName: 'gone.xlsx', size: 1, sha256: 'a'.repeat(64), importedAt: base.createdAt };
    await expect(session.save(join(dir, 'p3.tallywise'), { ...base, sources: [ref] })).rejects.toMatchObject({ name: 'ProjectSessionError', message: expect.stringContaining('gone.xlsx') });
  });
});
