import { describe, expect, it } from 'vitest';
import { parseModelSpec } from '@shared/model/spec';
import { buildTrendReport } from '@shared/report/build';
import { GENERAL_CAUTIONS } from '@shared/report/cautions';
import { compositeSentence } from '@shared/report/composite-section';
import { modelParagraph } from '@shared/report/methods';
import type { TableBlock } from '@shared/report/model';
import type { CompositeResult } from '@shared/trend/composite';
import { MARKUP, reference, shipsReport, shipsSpec } from './ships-report';

const composite = (last: { index: number; lower: number; upper: number }): CompositeResult['composite'] => ({
  indices: [{ time: 2012, index: 100, lower: 100, upper: 100 }, { time: 2013, ...last }],
  weights: { a: 1, b: 1 },
  replicates: 199,
  failedReplicates: 3,
  seed: 7,
  method: 'weighted geometric mean of the species\' annual indices (Buckland et al. 2005; Gregory et al. 2005); site-block bootstrap percentile limits',
});

describe('report model', () => {
  it('opens with the cautions, then the summary, one section per group, and ends with the appendix', async () => {
    const { doc } = await shipsReport();
    expect(doc.sections.map((s) => s.id)).toEqual(['cautions', 'summary', expect.stringMatching(/^group-/)]);
    const cautions = doc.sections[0].blocks[0];
    expect(cautions.kind === 'caution' && cautions.items).toEqual(GENERAL_CAUTIONS);
    expect(GENERAL_CAUTIONS.join(' ')).toMatch(/not the size of the population/);
    expect(GENERAL_CAUTIONS.join(' ')).toMatch(/statistician/);
    const group = doc.sections[2];
    expect(group.heading).toBe(MARKUP); // plain text in the model; escaping is the renderers' job
    expect(group.blocks.map((b) => b.kind)).toEqual(['paragraph', 'chart', 'table', 'paragraph', 'list', 'caution', 'paragraph', 'paragraph', 'table']);
  });

  it('the index table holds the indices of stats::glm on MASS::ships (MASS 7.3.58.2, R 4.2.2)', async () => {
    const { doc } = await shipsReport();
    const t = doc.sections[2].blocks.find((b): b is TableBlock => b.kind === 'table')!;
    reference.indices.forEach((r, i) => {
      expect(t.rows[i][0]).toBe(r.time);
      expect(Math.abs((t.rows[i][1] as number) - r.index) / r.index).toBeLessThan(1e-4);
    });
  });

  it('the appendix gives software version, input with SHA-256, the spec as JSON and the date', async () => {
    const { doc } = await shipsReport();
    const [list, code] = doc.appendix.blocks;
    expect(list.kind === 'list' && list.items.join('\n')).toMatch(/Tallywise 0\.0\.0-test[\s\S]*2026-01-02T03:04:05[\s\S]*SHA-256 (ab){32}[\s\S]*No random numbers/);
    expect(code.kind === 'code' && JSON.parse(code.text)).toEqual(JSON.parse(JSON.stringify(shipsSpec)));
  });

  it('cites the methods used and only those', async () => {
    const { doc } = await shipsReport();
    const keys = doc.references.map((r) => r.key);
    expect(keys).toEqual(expect.arrayContaining(['glm', 'delta', 'redList']));
    expect(keys).not.toContain('composite');
    expect(keys).not.toContain('negbin');
  });

  it('adds the composite section, sheet and citation when a composite is given', async () => {
    const { doc, result } = await shipsReport();
    const withComp = buildTrendReport({
      title: 't',
      spec: shipsSpec,
      groupColumn: 'species',
      groups: [{ group: 'a', result }, { group: 'b', result }],
      composite: composite({ index: 80, lower: 70, upper: 90 }),
      provenance: { software: { name: 'Tallywise', version: '1' }, inputs: [], seeds: [{ what: 'the composite bootstrap', value: 7 }], createdAt: doc.createdAt },
    });
    expect(withComp.sections.at(-1)!.heading).toBe('Composite of 2 species');
    expect(withComp.references.map((r) => r.key)).toEqual(expect.arrayContaining(['composite', 'indicators', 'bootstrap']));
    expect(withComp.sheets.map((s) => s.name)).toEqual(['Trend summary', 'Indices', 'Coefficients', 'Composite']);
    expect(JSON.stringify(withComp.sections.at(-1))).toContain('196 of 199 bootstrap replicates');
  });

  it('the composite sentence does not overstate', () => {
    expect(compositeSentence(composite({ index: 80, lower: 70, upper: 90 }), 2)).toMatch(/lower than at the start/);
    expect(compositeSentence(composite({ index: 120, lower: 105, upper: 140 }), 2)).toMatch(/higher than at the start/);
    expect(compositeSentence(composite({ index: 95, lower: 80, upper: 110 }), 2)).toMatch(/cannot tell/);
  });

  it('a group that could not be fitted is a caution, not a row of NaN', async () => {
    const { doc, result } = await shipsReport();
    const d = buildTrendReport({
      title: 't',
      spec: shipsSpec,
      groupColumn: 'species',
      groups: [{ group: 'a', result }, { group: 'b', error: 'Every count of "b" is zero.' }],
      provenance: { software: { name: 'Tallywise', version: '1' }, inputs: [], seeds: [], createdAt: doc.createdAt },
    });
    const summary = d.sections[1].blocks;
    expect((summary[0] as TableBlock).rows).toHaveLength(1);
    expect(summary[1]).toMatchObject({ kind: 'caution', items: ['Every count of "b" is zero.'] });
    expect(d.sections[3].blocks).toEqual([{ kind: 'caution', title: 'Not fitted', items: ['Every count of "b" is zero.'] }]);
    for (const s of d.sheets) for (const row of s.table.rows) for (const c of row) if (typeof c === 'number') expect(Number.isFinite(c)).toBe(true);
  });

  it('the methods paragraph is written from the spec: model, offsets, random site with its quadrature', () => {
    const p = modelParagraph(parseModelSpec({
      response: 'count',
      distribution: 'negbin',
      predictors: [{ column: 'habitat', type: 'factor', reference: 'reed' }],
      offsets: [{ column: 'minutes', log: true }, { column: 'area_m2', log: true }],
      site: { column: 'pond', effect: 'random', quadraturePoints: 9 },
      time: { column: 'season', trend: 'linear' },
    }));
    expect(p.text).toMatch(/negative binomial generalised linear model/);
    expect(p.text).toMatch(/log\("minutes"\) and log\("area_m2"\) entered as offsets/);
    expect(p.text).toMatch(/"habitat" \(factor, against "reed"\)/);
    expect(p.text).toMatch(/normal random intercept; .*Gauss-Hermite quadrature with 9 nodes/);
    expect(p.text).toMatch(/one log-linear slope on "season"/);
    expect(p.cites).toEqual(['negbin', 'quadrature']);
  });
});
