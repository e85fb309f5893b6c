import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeDemoWorkbooks } from '../../src-main/demo/write-workbooks';
import type { PlantedProblem } from '../../src-shared/demo/mess';
import { checkFile } from '../../src-main/import/check-file';
import { importFile } from '../../src-main/import/import-file';
import { applyMapping } from '../../src-shared/import/mapping';
import type { MappingTemplate } from '../../src-shared/import/mapping-template';
import { aggregateRecords } from '../../src-shared/import/aggregate';

/**
 * The check service on the demo programme: every problem the demo planted
 * (its own list of sheet, row and column) is found at that place.
 */
let dir: string;
let files: string[];
let planted: PlantedProblem[];
let templatePath: string;
let template: MappingTemplate;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tw-check-'));
  ({ files, planted } = await writeDemoWorkbooks(dir, { seed: 5 }));
  const first = await importFile(files[0]);
  const names = first.columns.map((c) => c.name);
  const species = names.slice(names.indexOf('Water temp (°C)') + 1, names.indexOf('Remarks'));
  template = {
    kind: 'tallywise-mapping', version: 1, sheet: 'Counts', layout: 'wide-species', dateOrder: 'dmy',
    columns: [
      { header: 'Pond', role: 'site' }, { header: 'Date', role: 'date' }, { header: 'Visit', role: 'visit' }, { header: 'Observer', role: 'observer' },
      { header: 'Minutes', role: 'effort', unit: 'minutes' }, { header: 'Water temp (°C)', role: 'covariate', name: 'water_temp' },
      ...species.map((s) => ({ header: s, role: 'count' as const })), { header: 'Remarks', role: 'ignore' },
    ],
    sites: { sheet: 'Ponds', columns: [{ header: 'Pond', role: 'site' }, { header: 'Area (m²)', role: 'area', unit: 'm2' }, { header: 'Habitat', role: 'covariate', name: 'habitat' }] },
  };
  templatePath = join(dir, 'mapping.json');
  await writeFile(templatePath, JSON.stringify(template));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

const expectedCode: Record<string, string | null> = {
  'present-not-counted-code': 'present-not-counted',
  'at-least-code': 'at-least-count',
  'pond-name-variant': 'similar-site-name',
  'duplicated-row': 'duplicate-record',
  'missing-minutes': 'effort-missing',
  'count-as-text': 'count-as-text',
  'not-surveyed-code': null, // a valid code: no finding, the record is not-surveyed
  'date-as-text': null, // read with the template's day-first order
};

describe('check service on the demo programme', () => {
  it('finds every planted problem at its sheet, row and column', async () => {
    expect(planted.length).toBeGreaterThan(5);
    for (const p of planted) {
      const file = files.find((f) => basename(f) === p.file)!;
      const report = await checkFile(file, { template: templatePath });
      const code = expectedCode[p.kind];
      if (code === undefined) throw new Error(`no expectation for planted kind ${p.kind}`);
      if (code === null) continue;
      const hit = report.findings.find((f) => f.code === code && f.sheet === p.sheet && f.row === p.row && (f.column === p.column || code === 'duplicate-record'));
      expect(hit, `${p.kind} at ${p.file} ${p.sheet}!${p.column}${p.row}`).toBeDefined();
      if (p.kind === 'pond-name-variant') expect(hit!.fix).toContain(`"${p.cleanValue}"`);
    }
  });

  it('reads planted codes and text dates to the clean values the demo lists', async () => {
    for (const p of planted.filter((x) => x.kind === 'date-as-text' || x.kind === 'not-surveyed-code')) {
      const table = await importFile(files.find((f) => basename(f) === p.file)!, { sheet: 'Counts', dateOrder: 'dmy' });
      const m = applyMapping(table, template);
      const rec = m.records.find((r) => r.row === p.row && (p.kind === 'date-as-text' || r.column === p.column))!;
      if (p.kind === 'date-as-text') expect(rec.date).toBe(p.cleanValue);
      else expect(rec.status).toBe('not-surveyed');
    }
  });

  it('re-applies one template to every season without template findings, and aggregates with area from the Ponds sheet', async () => {
    for (const file of files) {
      const report = await checkFile(file, { template: templatePath });
      expect(report.findings.filter((f) => f.code.startsWith('template-')), basename(file)).toEqual([]);
      // only the misspelt pond names planted by the demo lack an area
      const variants = planted.filter((p) => p.kind === 'pond-name-variant' && p.file === basename(file)).map((p) => p.found.trim());
      for (const f of report.findings.filter((x) => x.code === 'area-missing')) expect(variants.some((v) => f.message.includes(`"${v}"`)), f.message).toBe(true);
    }
    const counts = await importFile(files[0], { sheet: 'Counts' });
    const ponds = await importFile(files[0], { sheet: 'Ponds' });
    const m = applyMapping(counts, template, { siteTable: ponds });
    const a = aggregateRecords(m.records, { rule: 'sum', effortUnit: m.effortUnit, hasArea: m.hasArea });
    expect(a.effortColumn).toBe('effort_h');
    const area = a.table.columns.find((c) => c.name === 'area_ha')!;
    expect(Array.from(area.values).every((v) => v > 0)).toBe(true);
    expect(a.table.columns.find((c) => c.name === 'habitat')!.texts.every((t) => ['reed', 'sedge', 'open', 'wooded'].includes(t))).toBe(true);
  });

  it('without a template, guesses the mapping and says so', async () => {
    const r = await checkFile(files[0]);
    expect(r.templateSource).toBe('guessed');
    expect(r.findings.find((f) => f.code === 'mapping-guessed')!.message).toContain('site: "Pond"');
  });
});
