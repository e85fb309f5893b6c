import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { demoProjectWithImports } from '../../src-main/demo/demo-project';
import { writeDemoCsv } from '../../src-main/demo/write-workbooks';
import { projectAnalysis, type ProjectAnalysis } from '../../src-main/project/project-analysis';
import { parseProjectDocument } from '@shared/project/document';
import { speciesChosenTwice } from '@shared/project/schema';
import { recordId } from '@shared/host/contract';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { findColumn, type DataTable } from '@shared/data/table';
import type { PlantedProblem } from '@shared/demo/mess';
import { fitModel } from '@shared/engine/fit';
import { fitTableFor } from '@shared/data/fit-rows';

// The demo's planted problems and its clean table both come from the seeded
// simulation (invented demo data): the clean table is the truth before the
// mess, so after the recorded cleaning the analysis table must equal it
// except where a planted value cannot be recovered by cleaning ("NS", "x"
// and ">50" hide the true count; the log leaves them as the import reads them).

const made = demoProjectWithImports();

function cell(t: DataTable, name: string, k: number): string {
  return findColumn(t, name)?.texts[k] ?? '';
}

function num(t: DataTable, name: string, k: number): number {
  return findColumn(t, name)?.values[k] ?? Number.NaN;
}

interface Clean {
  count: number;
  minutes: number;
  areaM2: number;
  habitat: string;
  visits: number;
}

function cleanRows(): Map<string, Clean> {
  const parsed = Papa.parse<Record<string, string>>(writeDemoCsv().trim(), { header: true });
  const label = new Map(DEMO_TRUTH.species.map((s) => [s.key, s.label]));
  return new Map(
    parsed.data.map((r) => [`${r.pond}|${r.season}|${label.get(r.species)}`, { count: Number(r.count), minutes: Number(r.minutes), areaM2: Number(r.area_m2), habitat: r.habitat, visits: Number(r.visits) }]),
  );
}

describe('the demo project with its recorded cleaning', () => {
  it('is a valid current document: Ponds linked as the site list, one chosen model per species', async () => {
    const { document: doc } = await made;
    const parsed = parseProjectDocument(JSON.parse(JSON.stringify(doc)));
    expect(parsed.sites).toMatchObject({ sheet: 'Ponds', siteColumn: 'Pond', area: { column: 'Area (m²)', unit: 'm2' }, covariates: ['Habitat'] });
    const species = DEMO_TRUTH.species.map((s) => s.label).sort();
    expect([...new Set(parsed.models.map((m) => m.species))].sort()).toEqual(species);
    expect(speciesChosenTwice(parsed.models)).toEqual([]);
    expect(parsed.models.filter((m) => m.chosen).map((m) => [m.species, m.spec.distribution]).sort()).toEqual([
      ['Common frog', 'negbin'],
      ['Common toad', 'negbin'],
      ['Natterjack toad', 'zinb'],
      ['Pool frog', 'negbin'],
    ]);
  });

  it('records one action per planted problem that needs one, each with a reason, the grid entry kinds', async () => {
    const { document: doc, planted } = await made;
    const needs = planted.filter((p) => ['pond-name-variant', 'duplicated-row', 'missing-minutes'].includes(p.kind));
    const entries = doc.cleaning.entries;
    expect(doc.cleaning.cursor).toBe(entries.length);
    expect(new Set(entries.map((e) => e.time)).size).toBe(needs.length);
    expect(entries.every((e) => (e.reason ?? '').length > 10)).toBe(true);
    expect(entries.filter((e) => e.kind === 'merge-name').map((e) => e.kind === 'merge-name' && [e.from, e.into])).toEqual(
      needs.filter((p) => p.kind === 'pond-name-variant').map((p) => [p.found.trim(), p.cleanValue]),
    );
    // The repeated visit row: its four species records left out.
    const exclude = entries.find((e) => e.kind === 'exclude');
    expect(exclude && exclude.kind === 'exclude' && exclude.recordIds.length).toBe(DEMO_TRUTH.species.length);
    // The blank minutes: set on each record of the visit, as the grid does for a visit field.
    expect(entries.filter((e) => e.kind === 'set-value' && e.field === 'effort' && e.old === null && e.new === 10)).toHaveLength(DEMO_TRUTH.species.length);
  });

  it('gives, through projectAnalysis, the clean simulated table except where the log keeps a planted code', async () => {
    const { document: doc, planted } = await made;
    const a: ProjectAnalysis = await projectAnalysis(doc);
    expect(a.siteProblems).toEqual([]);
    expect(a.conflicts).toEqual([]);
    expect(a.roles).toEqual({ site: 'site', season: 'season', species: 'species', count: 'count', effort: 'effort_h', area: 'area_ha', covariates: ['habitat'] });
    const clean = cleanRows();
    const t = a.table;
    expect(t.nrows).toBe(clean.size);
    // What the kept codes hide, by analysis row: the hidden count, and for NS / x the visit's minutes and the visit itself.
    const hidden = new Map<string, { count: number; minutes: number; visits: number }>();
    const raw = new Map(a.raw.map((r) => [r.id, r]));
    for (const p of planted as PlantedProblem[]) {
      if (!['not-surveyed-code', 'present-not-counted-code', 'at-least-code'].includes(p.kind)) continue;
      const source = a.sources.find((s) => s.name === p.file)!;
      const rec = raw.get(recordId(source.id, p.sheet, p.column, p.row))!;
      const key = `${rec.fields.site}|${p.season}|${p.header}`;
      const h = hidden.get(key) ?? { count: 0, minutes: 0, visits: 0 };
      const atLeast = p.kind === 'at-least-code';
      hidden.set(key, { count: h.count + Number(p.cleanValue) - (atLeast ? Number(rec.fields.count) : 0), minutes: h.minutes + (atLeast ? 0 : Number(rec.fields.effort)), visits: h.visits + (atLeast ? 0 : 1) });
    }
    expect(hidden.size).toBe(planted.filter((p) => ['not-surveyed-code', 'present-not-counted-code', 'at-least-code'].includes(p.kind)).length);
    let differing = 0;
    for (let k = 0; k < t.nrows; k++) {
      const key = `${cell(t, 'site', k)}|${cell(t, 'season', k)}|${cell(t, 'species', k)}`;
      const c = clean.get(key);
      expect(c, key).toBeDefined();
      const h = hidden.get(key) ?? { count: 0, minutes: 0, visits: 0 };
      if (h.visits || h.count) differing++;
      expect(num(t, 'count', k) + h.count, `count of ${key}`).toBe(c!.count);
      expect(num(t, 'visits', k) + h.visits, `visits of ${key}`).toBe(c!.visits);
      expect(num(t, 'effort_h', k) + h.minutes / 60, `effort of ${key}`).toBeCloseTo(c!.minutes / 60, 10);
      expect(num(t, 'area_ha', k), `area of ${key}`).toBeCloseTo(c!.areaM2 / 1e4, 12);
      expect(cell(t, 'habitat', k)).toBe(c!.habitat);
    }
    expect(differing).toBe(hidden.size);
  });

  it('its chosen models fit with the engine; for natterjack the zero-inflated one is supported over the negative binomial', async () => {
    // The demo simulates natterjack counts with extra zeros (DEMO_TRUTH: extra zeros 0.35 a visit) and the
    // other species without; the recorded choice must be one the comparison backs: a lower AIC on the same rows.
    const { document: doc } = await made;
    const a = await projectAnalysis(doc);
    const fits = doc.models.map((m) => ({ m, fit: fitModel(fitTableFor(a.table, m.spec, [m.species], m.dropBadOffsetRows).table, m.spec) }));
    for (const { m, fit } of fits) {
      expect(fit.summary.converged, `${m.species} ${m.spec.distribution}`).toBe(true);
      expect(fit.warnings.map((w) => w.code), `${m.species} ${m.spec.distribution}`).toEqual([]);
    }
    const natter = DEMO_TRUTH.species.find((s) => s.zeroInflation > 0)!;
    expect(DEMO_TRUTH.species.filter((s) => s.zeroInflation > 0)).toHaveLength(1);
    const nb = fits.find((f) => f.m.species === natter.label && f.m.spec.distribution === 'negbin')!;
    const zinb = fits.find((f) => f.m.species === natter.label && f.m.spec.distribution === 'zinb')!;
    expect(zinb.m.chosen).toBe(true);
    expect(nb.fit.rows.length).toBe(zinb.fit.rows.length);
    expect(zinb.fit.summary.aic!).toBeLessThan(nb.fit.summary.aic! - 2);
  }, 120_000);
});
