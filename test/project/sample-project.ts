import { appendEdit, emptyLog, revertEntry } from '@shared/cleaning/edit-log';
import { createProjectDocument, type ProjectDocument } from '@shared/project/document';
import { gridFromRows, type GridCell } from '@shared/project/sheet-grid';
import { createRng } from '@shared/demo/prng';

/**
 * An invented project with every part filled in, for the file tests.
 * `cells` sets the size of the one imported sheet (rows of 8 cells; seeded
 * texts so the body does not compress to nothing).
 */
export function sampleProject(options: { cells?: number; seed?: number; name?: string } = {}): ProjectDocument {
  const rng = createRng(options.seed ?? 11);
  const rows: GridCell[][] = [['site', 'date', 'visit', 'species', 'count', 'effort_min', 'observer', 'note'].map((text) => ({ text, type: 'text' as const }))];
  const nrows = Math.max(1, Math.ceil((options.cells ?? 400) / 8));
  for (let r = 1; r < nrows; r++) {
    const count = Math.floor(rng.uniform() * 60);
    rows.push([
      { text: `Site ${Math.floor(rng.uniform() * 90)}`, type: 'text' },
      { text: `2025-0${1 + (r % 9)}-1${r % 10}`, type: 'date' },
      { text: String(1 + (r % 4)), type: 'number' },
      { text: ['Teal', 'Wigeon', 'Coot', 'Little grebe'][r % 4], type: 'text' },
      r % 17 === 0 ? { text: 'NS', type: 'text' } : { text: String(count), type: 'number' },
      { text: (30 + rng.uniform() * 90).toFixed(1), type: 'number' },
      { text: `obs${Math.floor(rng.uniform() * 1e6).toString(36)}`, type: 'text' },
      r % 5 === 0 ? { text: 'windy; ärger über Nebel', type: 'text' } : { text: '', type: 'blank' },
    ]);
  }
  let log = emptyLog();
  const clock = () => new Date('2026-02-02T08:30:00.000Z');
  log = appendEdit(log, { kind: 'set-value', recordId: 's1#Counts#5', field: 'count', old: 40, new: 4, reason: 'extra zero typed' }, clock);
  log = appendEdit(log, { kind: 'merge-name', field: 'site', from: 'Site 3', into: 'Site 03', author: 'A. Analyst' }, clock);
  log = appendEdit(log, { kind: 'exclude', recordIds: ['s1#Counts#9', 's1#Counts#10'], reason: 'survey abandoned' }, clock);
  log = appendEdit(log, { kind: 'convert-unit', field: 'effort_min', recordIds: ['s1#Counts#12'], factor: 1 / 60, fromUnit: 'min', toUnit: 'h' }, clock);
  log = revertEntry(log, 'e2', { reason: 'names are different sites' }, clock);
  return {
    ...createProjectDocument(options.name ?? 'Riverside wetland counts', new Date('2026-01-15T12:00:00.000Z')),
    sources: [
      {
        id: 's1',
        fileName: 'season-2025.xlsx',
        size: 48213,
        sha256: 'a'.repeat(64),
        importedAt: '2026-01-15T12:05:00.000Z',
        sheets: [{ ...gridFromRows('Counts', rows), merges: [{ top: 1, left: 1, bottom: 1, right: 2 }] }, { ...gridFromRows('Old', []), hidden: true }],
      },
    ],
    mapping: { site: 'site', date: 'date', count: 'count', effort: { column: 'effort_min', unit: 'min' } },
    fieldCodeRules: [
      { id: 'ns', status: 'not-surveyed', texts: ['NS', 'n/s'] },
      { id: 'gt', status: 'at-least', pattern: String.raw`^>\s*(\d+)$`, note: 'lower bound' },
      { id: 'dash', status: 'counted', texts: ['-'], number: 0 },
    ],
    cleaning: log,
    aggregation: { groupBy: ['site', 'season'], count: 'sum', effort: 'sum', minVisits: 2 },
    sites: { sourceId: 's1', sheet: 'Old', headerRow: 1, siteColumn: 'Site', area: { column: 'Area (ha)', unit: 'ha' }, covariates: ['Habitat'] },
    models: [
      {
        id: 'm1',
        name: 'Negative binomial with effort',
        species: 'Teal',
        chosen: true,
        dropBadOffsetRows: true,
        spec: {
          response: 'count',
          distribution: 'negbin',
          predictors: [{ column: 'habitat', type: 'factor', reference: 'reed' }],
          offsets: [{ column: 'effort_h', log: true }],
          zeroPredictors: [],
          site: { column: 'site', effect: 'random', quadraturePoints: 9 },
          time: { column: 'year', trend: 'annual', base: 2012 },
          robust: 'none',
        },
      },
      { id: 'm2', name: 'Poisson', species: 'Teal', chosen: false, dropBadOffsetRows: false, spec: { response: 'count', distribution: 'poisson', predictors: [], offsets: [], zeroPredictors: [], robust: 'site' } },
    ],
    fitCache: [{ modelId: 'm1', key: 'f'.repeat(16), computedAt: '2026-01-20T09:00:00.000Z' }],
    report: { outputFolder: '/home/analyst/reports/2025', species: ['Teal', 'Coot'] },
    seeds: { bootstrap: 20250101, simulation: 7 },
  };
}
