import Papa from 'papaparse';
import { beforeAll, describe, expect, it } from 'vitest';
import { splitBy, tableFromTexts, type DataTable } from '@shared/data/table';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { FitCancelled } from '@shared/engine/types';
import { parseModelSpec, type ModelSpec } from '@shared/model/spec';
import type { ReportDocument, TableBlock } from '@shared/report/model';
import { buildProgrammeReport, COMPOSITE_STEP, type PlannedGroup, type ProgrammePlan, type ProgrammeProgress } from '@shared/report/programme-report';
import { writeDemoCsv } from '../../src-main/demo/write-workbooks';
import demoSpecJson from '../../resources/demo/trend-spec.json';

// The demo is our invented, seeded scenario; its true trends
// (src-shared/demo/truth.ts) are the outside check of the numbers here.
// The rest checks the run itself: per-group specs, progress, cancel, the
// composite and why it is left out.

const spec = parseModelSpec(demoSpecJson);
let table: DataTable;
let groups: PlannedGroup[];

beforeAll(() => {
  const csv = Papa.parse<string[]>(writeDemoCsv({}).trim(), { skipEmptyLines: true }).data;
  table = tableFromTexts(csv[0], csv.slice(1));
  groups = splitBy(table, 'species').map((g) => ({ group: g.key, label: DEMO_TRUTH.species.find((s) => s.key === g.key)?.label, table: g.table, spec }));
});

function plan(over: Partial<ProgrammePlan> = {}): ProgrammePlan {
  return {
    title: 'Test programme',
    groupColumn: 'species',
    groups,
    provenance: { software: { name: 'Tallywise', version: 'test' }, inputs: [{ name: 'demo.csv', sha256: '0'.repeat(64) }], seeds: [], createdAt: '2026-01-01T00:00:00.000Z' },
    ...over,
  };
}

function summary(doc: ReportDocument): TableBlock {
  return doc.sheets.find((s) => s.name === 'Trend summary')!.table;
}

const poisson = (s: ModelSpec): ModelSpec => ({ ...s, distribution: 'poisson' });

describe('buildProgrammeReport', () => {
  let doc: ReportDocument;
  let steps: ProgrammeProgress[];
  beforeAll(async () => {
    steps = [];
    doc = await buildProgrammeReport(plan({ compositeTable: table, replicates: 20, seed: 7 }), { onProgress: (p) => steps.push(p) });
  }, 120_000);

  it("each species' true trend lies within the limits of its row in the summary", () => {
    const rows = summary(doc).rows;
    for (const truth of DEMO_TRUTH.species) {
      const row = rows.find((r) => r[0] === truth.label)!;
      expect(row, truth.key).toBeDefined();
      expect(row[2] as number, truth.key).toBeLessThanOrEqual(truth.annualChange);
      expect(row[3] as number, truth.key).toBeGreaterThanOrEqual(truth.annualChange);
    }
  });

  it('reports progress for each species in turn, then the composite, ending with everything done', () => {
    const order = [...new Set(steps.map((s) => s.group).filter(Boolean))];
    expect(order).toEqual([...groups.map((g) => g.group), COMPOSITE_STEP]);
    expect(steps.every((s) => s.total === groups.length + 1 && s.fraction >= 0 && s.fraction <= 1)).toBe(true);
    for (let i = 1; i < steps.length; i++) expect(steps[i].done).toBeGreaterThanOrEqual(steps[i - 1].done);
    expect(steps.at(-1)).toMatchObject({ done: groups.length + 1, total: groups.length + 1 });
  });

  it('holds the composite and records its seed in the appendix', () => {
    expect(doc.sheets.map((s) => s.name)).toContain('Composite');
    const appendix = JSON.stringify(doc.appendix);
    expect(appendix).toContain('Seed of the composite bootstrap: 7.');
  });

  it("fits each species with its own spec: a Poisson model for one species has no theta in that species' fit line", async () => {
    const own = groups.map((g, i) => (i === 0 ? { ...g, spec: poisson(g.spec) } : g));
    const d = await buildProgrammeReport(plan({ groups: own }));
    const text = (id: string) => JSON.stringify(d.sections.find((s) => s.heading === id));
    expect(text(own[0].label!)).not.toMatch(/theta \d/);
    expect(text(own[1].label!)).toMatch(/theta \d/);
  }, 120_000);

  it("builds the composite from each species' own model: its index is the geometric mean of the species' indices (Buckland et al. 2005)", async () => {
    const own = groups.map((g, i) => (i === 0 ? { ...g, spec: poisson(g.spec) } : g));
    const d = await buildProgrammeReport(plan({ groups: own, compositeTable: table, replicates: 20 }));
    const sheet = (name: string) => d.sheets.find((s) => s.name === name)!.table.rows;
    const bySeason = new Map<string, number[]>();
    for (const r of sheet('Indices')) bySeason.set(String(r[1]), [...(bySeason.get(String(r[1])) ?? []), r[2] as number]);
    for (const r of sheet('Composite')) {
      const logs = bySeason.get(String(r[0]))!;
      expect(logs).toHaveLength(groups.length);
      expect(r[1] as number).toBeCloseTo(Math.exp(logs.reduce((a, x) => a + Math.log(x), 0) / logs.length), 6);
    }
  }, 120_000);

  it('leaves the composite out, and says why, when a chosen model has no site column', async () => {
    const noSite = groups.map((g, i) => (i === 1 ? { ...g, spec: { ...g.spec, site: undefined } } : g));
    const d = await buildProgrammeReport(plan({ groups: noSite, compositeTable: table }));
    expect(d.sheets.map((s) => s.name)).not.toContain('Composite');
    expect(JSON.stringify(d.sections)).toContain('the model of each species needs the same \\"site\\" column');
  }, 120_000);

  it('rejects with FitCancelled once the signal is raised, during the second species', async () => {
    const signal = { aborted: false };
    const seen: string[] = [];
    const run = buildProgrammeReport(plan(), {
      signal,
      onProgress: (p) => {
        seen.push(p.group);
        if (p.group === groups[1].group) signal.aborted = true;
      },
    });
    await expect(run).rejects.toBeInstanceOf(FitCancelled);
    expect(seen).not.toContain(groups[2].group);
  }, 120_000);

  it('names a species whose model cannot be fitted and reports the others', async () => {
    const broken = groups.map((g, i) => (i === 0 ? { ...g, spec: { ...g.spec, response: 'no_such_column' } } : g));
    const d = await buildProgrammeReport(plan({ groups: broken }));
    expect(summary(d).rows).toHaveLength(groups.length - 1);
    expect(JSON.stringify(d.sections)).toContain(`${broken[0].label}: not fitted`);
  }, 120_000);
});
