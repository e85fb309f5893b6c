import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { migrateToCurrent, versionOf, type Migration } from '@shared/project/migrations';
import { parseProjectDocument, ProjectDocumentError } from '@shared/project/document';
import { CURRENT_FORMAT_VERSION } from '@shared/project/schema';
import { v1ToV2 } from '@shared/project/migrations/v1-to-v2';
import { v2ToV3 } from '@shared/project/migrations/v2-to-v3';
import { cellAt } from '@shared/project/sheet-grid';

// Fixture: test/project/fixtures/project-v0.json, a hand-written body in the
// invented version-0 shape. Expected values are worked by hand from the
// step's definition in src-shared/project/migrations/v0-to-v1.ts.
const v0 = JSON.parse(readFileSync(join(__dirname, 'fixtures/project-v0.json'), 'utf8'));

describe('migration v0 -> current', () => {
  const { doc, fromVersion, steps } = migrateToCurrent(v0);
  const project = parseProjectDocument(doc);

  it('runs every step and gives a valid current document', () => {
    expect(fromVersion).toBe(0);
    expect(steps).toHaveLength(CURRENT_FORMAT_VERSION);
    expect(project.formatVersion).toBe(CURRENT_FORMAT_VERSION);
    expect(project.programme.name).toBe('Hillside pasture transects');
    expect(project.createdAt).toBe('2024-11-02T09:00:00Z');
  });

  it('packs each sheet into a grid, padding short rows and inferring cell types', () => {
    const [visits, notes] = project.sources[0].sheets;
    expect(project.sources[0]).toMatchObject({ id: 's1', fileName: 'transects-2024.xlsx', size: 20480, sha256: '0123456789abcdef'.repeat(4) });
    expect(visits).toMatchObject({ name: 'Visits', rows: 4, columns: 4 });
    expect(visits.types).toBe('ssss' + 'ssnn' + 'ss_n' + 's___');
    expect(cellAt(visits, 2, 3)).toEqual({ text: '50.5', type: 'number' });
    expect(cellAt(visits, 3, 0)).toEqual({ text: 'T3', type: 'text' });
    expect(notes).toMatchObject({ rows: 1, columns: 1, texts: ['all visits by one observer'] });
  });

  it('numbers the edits and puts the cursor after them', () => {
    expect(project.cleaning.cursor).toBe(2);
    expect(project.cleaning.nextSeq).toBe(3);
    expect(project.cleaning.entries).toEqual([
      { id: 'e1', time: '2024-11-03T10:00:00Z', author: 'J. Doe', kind: 'set-value', recordId: 'f1#Visits#3', field: 'hares', old: null, new: '0' },
      { id: 'e2', time: '2024-11-03T10:05:00Z', kind: 'exclude', recordIds: ['f1#Visits#4'], reason: 'transect flooded' },
    ]);
  });

  it('names the models, marks the chosen one, fills spec defaults, keeps the rest', () => {
    expect(project.models.map((m) => [m.id, m.name, m.chosen])).toEqual([
      ['m1', 'Model 1', false],
      ['m2', 'Model 2', true],
    ]);
    expect(project.models[0].spec).toMatchObject({ robust: 'none', predictors: [], offsets: [{ column: 'minutes', log: true }] });
    expect(project.models[1].spec.site).toEqual({ column: 'transect', effect: 'fixed', quadraturePoints: 9 });
    expect(project.aggregation).toEqual({ groupBy: ['site', 'season'], count: 'max', effort: 'sum', minVisits: 1 });
    expect(project.mapping).toEqual({ site: 'transect', count: 'hares', effort: 'minutes' });
    expect(project.fieldCodeRules).toEqual([
      { id: 'code-1', status: 'not-surveyed', texts: ['NS'] },
      { id: 'code-2', status: 'invalid', texts: ['??'], note: 'Read as invalid: the older project said "unclear".' },
    ]);
    expect(project.seeds).toEqual({ bootstrap: 42 });
    expect(project.report).toEqual({ outputFolder: null, species: [] });
  });

  it('leaves the input object as it was', () => {
    expect(v0).toEqual(JSON.parse(readFileSync(join(__dirname, 'fixtures/project-v0.json'), 'utf8')));
  });

  it('reports a malformed old body by its path', () => {
    const bad = { ...v0, files: [{ ...v0.files[0], bytes: 'many' }] };
    expect(() => migrateToCurrent(bad)).toThrow(ProjectDocumentError);
    expect(() => migrateToCurrent(bad)).toThrow(/format version 0 .*files\.0\.bytes/);
  });
});

// Fixture: test/project/fixtures/project-v1.json, hand-written in the
// version-1 shape. Expected values are worked by hand from the step's
// definition in src-shared/project/migrations/v1-to-v2.ts.
const v1 = JSON.parse(readFileSync(join(__dirname, 'fixtures/project-v1.json'), 'utf8'));

describe('migration v1 -> v2', () => {
  const { doc, fromVersion, steps } = migrateToCurrent(v1);
  const project = parseProjectDocument(doc);

  it('runs the steps from 1 and gives a valid current document with the other members unchanged', () => {
    expect(fromVersion).toBe(1);
    expect(steps).toEqual(['1 -> 2: models per species with the offset-row choice, a link to a site-attributes sheet', '2 -> 3: a history of the reports made (empty for older files)']);
    expect(project.formatVersion).toBe(3);
    expect(project.sites).toBeNull();
    expect(project.sources).toEqual(v1.sources);
    expect(project.report).toEqual(v1.report);
    expect(project.seeds).toEqual({ bootstrap: 5 });
  });

  it('gives each model one copy per report species, fresh ids not clashing with old ones, one chosen per species', () => {
    expect(project.models.map((m) => [m.id, m.species, m.name, m.chosen, m.dropBadOffsetRows])).toEqual([
      ['m1', 'Knot', 'Poisson', true, false],
      ['m1-2x', 'Dunlin', 'Poisson', true, false],
      ['m2', 'Knot', 'Negative binomial', false, false],
      ['m2-2', 'Dunlin', 'Negative binomial', false, false],
      ['m1-2', 'Knot', 'Hurdle', false, false],
      ['m1-2-2', 'Dunlin', 'Hurdle', false, false],
    ]);
    expect(project.models[2].spec).toMatchObject({ response: 'count', distribution: 'negbin', robust: 'none' });
  });

  it('drops the fit cache, whose ids were the old ones', () => {
    expect(project.fitCache).toEqual([]);
  });

  it('a version-1 model with no report species keeps its id with species not said', () => {
    const { doc: d } = migrateToCurrent({ ...v1, report: { outputFolder: null, species: [] } });
    expect(parseProjectDocument(d).models.map((m) => [m.id, m.species, m.chosen])).toEqual([
      ['m1', '', true],
      ['m2', '', false],
      ['m1-2', '', false],
    ]);
  });

  it('reports a malformed version-1 model by its path', () => {
    expect(() => migrateToCurrent({ ...v1, models: [{ id: 'm1', chosen: 'yes' }] })).toThrow(/format version 1 .*models\.0\./);
  });
});

// The version-2 body is the v1 fixture after its own step (checked above);
// expected values follow from src-shared/project/migrations/v2-to-v3.ts.
describe('migration v2 -> v3', () => {
  const v2 = v1ToV2.upgrade(v1) as Record<string, unknown>;

  it('adds an empty report history and changes nothing else', () => {
    const { doc, fromVersion, steps } = migrateToCurrent(v2);
    expect(fromVersion).toBe(2);
    expect(steps).toEqual(['2 -> 3: a history of the reports made (empty for older files)']);
    const { formatVersion, reportHistory, ...rest } = doc as Record<string, unknown>;
    expect(formatVersion).toBe(3);
    expect(reportHistory).toEqual([]);
    const { formatVersion: _v, ...before } = v2;
    expect(rest).toEqual(before);
    expect(parseProjectDocument(doc).reportHistory).toEqual([]);
  });

  it('the step reads only version-2 bodies', () => {
    expect(() => v2ToV3.upgrade(v1)).toThrow();
    expect(() => v2ToV3.upgrade(null)).toThrow();
  });

  it('a current body with a malformed history entry is refused, naming the place', () => {
    const current = parseProjectDocument(migrateToCurrent(v2).doc);
    const entry = { madeAt: '2026-01-01T00:00:00Z', software: { name: 'Tallywise', version: '0.1.0' }, files: [{ name: 'r.pdf', sha256: 'xyz' }], dataKey: null, species: [], composite: null };
    expect(() => parseProjectDocument({ ...current, reportHistory: [entry] })).toThrow(/reportHistory\.0\.files\.0\.sha256: a SHA-256/);
    const good = { ...entry, files: [{ name: 'r.pdf', sha256: 'ab'.repeat(32) }] };
    expect(parseProjectDocument({ ...current, reportHistory: [good] }).reportHistory).toEqual([good]);
  });
});

describe('format version 2 checks', () => {
  const base = parseProjectDocument(migrateToCurrent(v1).doc);

  it('refuses two chosen models of one species, naming the species', () => {
    const models = base.models.map((m) => (m.id === 'm2' ? { ...m, chosen: true } : m));
    expect(() => parseProjectDocument({ ...base, models })).toThrow(/models: more than one model of "Knot" is chosen/);
  });

  it('checks the site-sheet link: area unit and site column', () => {
    const sites = { sourceId: 's1', sheet: 'Roosts', siteColumn: 'roost', area: { column: 'size', unit: 'acre' }, covariates: [] };
    expect(() => parseProjectDocument({ ...base, sites })).toThrow(/sites\.area\.unit/);
    const good = parseProjectDocument({ ...base, sites: { ...sites, area: null } });
    expect(good.sites).toEqual({ sourceId: 's1', sheet: 'Roosts', headerRow: 1, siteColumn: 'roost', area: null, covariates: [] });
  });
});

describe('migration runner', () => {
  const tag = (n: number): Migration => ({ from: n, to: n + 1, summary: `step ${n}`, upgrade: (d) => ({ ...(d as object), formatVersion: n + 1, trail: [...((d as { trail?: number[] }).trail ?? []), n] }) });

  it('runs the steps in version order whatever order they are listed in', () => {
    const r = migrateToCurrent({ formatVersion: 0 }, [tag(2), tag(0), tag(1)], 3);
    expect(r.doc).toEqual({ formatVersion: 3, trail: [0, 1, 2] });
    expect(r.steps).toEqual(['0 -> 1: step 0', '1 -> 2: step 1', '2 -> 3: step 2']);
  });

  it('starts from the version the body has and does nothing for a current body', () => {
    expect(migrateToCurrent({ formatVersion: 2 }, [tag(0), tag(1), tag(2)], 3).doc).toEqual({ formatVersion: 3, trail: [2] });
    expect(migrateToCurrent({ formatVersion: 3 }, [tag(0)], 3).steps).toEqual([]);
  });

  it('refuses a gap, a newer body and a body without a version', () => {
    expect(() => migrateToCurrent({ formatVersion: 0 }, [tag(0), tag(2)], 3)).toThrow(/no way to convert format version 1 to 2/);
    expect(() => migrateToCurrent({ formatVersion: 4 }, [], 3)).toThrow(/newer than 3/);
    expect(() => migrateToCurrent({ name: 'x' })).toThrow(/does not say which format version/);
    expect(versionOf({ version: 0 })).toBe(0);
    expect(versionOf({ formatVersion: 1.5 })).toBeUndefined();
  });
});
