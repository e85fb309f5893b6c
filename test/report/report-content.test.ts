/**
 * The report's optional content: the group's own spec in its methods and the
 * appendix, the diagnostics charts, the data summary, what cleaning changed
 * and the project's SHA-256. Expected values are counted by hand from the
 * small tables and logs written out here (invented for the test).
 */
import { describe, expect, it } from 'vitest';
import type { EditLog } from '@shared/cleaning/edit-entry';
import { tableFromTexts } from '@shared/data/table';
import { fitModel } from '@shared/engine/fit';
import { parseModelSpec } from '@shared/model/spec';
import { buildTrendReport } from '@shared/report/build';
import { auditLogTable } from '@shared/report/cleaning-summary';
import { dataSummary } from '@shared/report/data-summary';
import { diagnosticsBlocks, groupDiagnostics, MAX_RESIDUAL_POINTS } from '@shared/report/diagnostics-section';
import type { ChartBlock, CodeBlock, ParagraphBlock } from '@shared/report/model';
import { renderChartSvg } from '../../src-main/report/svg';
import { shipsReport, shipsSpec, shipsTable } from './ships-report';

const t = '2026-01-01T00:00:00.000Z';
const log: EditLog = {
  entries: [
    { id: 'e1', time: t, kind: 'exclude', recordIds: ['r1', 'r2'], reason: 'pond dry' },
    { id: 'e2', time: t, kind: 'exclude', recordIds: ['r3'], reason: 'pond dry' },
    { id: 'e3', time: t, kind: 'set-value', recordId: 'r4', field: 'count', old: 400, new: 40, reason: 'typing slip' },
    { id: 'e4', time: t, kind: 'exclude', recordIds: ['r5'], reason: 'wrong form' },
    { id: 'e5', time: t, kind: 'revert', target: 'e4' },
    { id: 'e6', time: t, kind: 'merge-name', field: 'site', from: 'Pond  A', into: 'Pond A' },
    { id: 'e7', time: t, kind: 'exclude', recordIds: ['r9'], reason: 'undone later' },
  ],
  cursor: 6,
  nextSeq: 8,
};

describe('what cleaning changed', () => {
  // Grouping and counting: test/report/cleaning-summary.test.ts.
  it('lists the whole log with each entry’s status for the audit sheet', () => {
    const table = auditLogTable(log);
    expect(table.rows.map((r) => [r[0], r[6], r[7], r[9]])).toEqual([
      ['e1', '', '', 'in effect'],
      ['e2', '', '', 'in effect'],
      ['e3', '400', '40', 'in effect'],
      ['e4', '', '', 'reverted'],
      ['e5', 'e4', '', 'in effect'],
      ['e6', 'Pond  A', 'Pond A', 'in effect'],
      ['e7', '', '', 'undone'],
    ]);
  });
});

describe('data summary', () => {
  it('sums the visits column when there is one', () => {
    const table = tableFromTexts(['site', 'season', 'count', 'visits'], [['A', '1', '2', '3'], ['B', '1', '0', '2'], ['A', '2', '5', '1']]);
    const spec = parseModelSpec({ response: 'count', distribution: 'poisson', predictors: [], offsets: [], time: { column: 'season', trend: 'linear' } });
    expect(dataSummary(table, spec).seasons.map((s) => [s.records, s.visits, s.effort])).toEqual([[2, 5, null], [1, 1, null]]);
  });

  it('counts sites, records, animals and effort per season, leaving out blank counts', () => {
    const table = tableFromTexts(['site', 'season', 'count', 'minutes'], [
      ['A', '2020', '3', '10'],
      ['A', '2020', '1', '5'],
      ['B', '2020', '0', '20'],
      ['A', '2021', '', '10'],
      ['B', '2021', '7', '15'],
    ]);
    const spec = parseModelSpec({ response: 'count', distribution: 'poisson', predictors: [], offsets: [{ column: 'minutes', log: true }], time: { column: 'season', trend: 'annual' } });
    expect(dataSummary(table, spec)).toEqual({
      timeColumn: 'season',
      siteColumn: 'site',
      effortColumn: 'minutes',
      visitsColumn: null,
      seasons: [
        { time: 2020, sites: 2, records: 3, visits: null, counted: 4, effort: 35 },
        { time: 2021, sites: 1, records: 1, visits: null, counted: 7, effort: 15 },
      ],
      blankRows: 1,
    });
  });
});

describe('report with the optional content', () => {
  it('writes each group’s methods from its own spec, with its citations, and puts both specs in the appendix', async () => {
    const { result } = await shipsReport();
    const nbSpec = parseModelSpec({ ...shipsSpec, distribution: 'negbin' });
    const doc = buildTrendReport({
      title: 'Two models',
      spec: shipsSpec,
      groupColumn: 'species',
      groups: [{ group: 'a', result }, { group: 'b', result, spec: nbSpec }],
      provenance: { software: { name: 'Tallywise', version: 'test' }, inputs: [], seeds: [], createdAt: t, project: { name: 'p.tallywise', sha256: 'cd'.repeat(32) } },
      cleaning: log,
    });
    const methods = (id: string) => doc.sections.find((s) => s.id === id)!.blocks.find((b): b is ParagraphBlock => b.kind === 'paragraph' && b.text.startsWith('The counts in'))!;
    expect(methods('group-a').text).toMatch(/a Poisson generalised linear model/);
    expect(methods('group-b').text).toMatch(/a negative binomial generalised linear model/);
    expect(methods('group-b').cites).toContain('negbin');
    expect(doc.references.map((r) => r.key)).toContain('negbin');
    const specs = doc.appendix.blocks.filter((b): b is CodeBlock => b.kind === 'code');
    expect(specs.map((s) => s.title)).toEqual(['Model spec of a (JSON)', 'Model spec of b (JSON)']);
    expect(specs.map((s) => JSON.parse(s.text).distribution)).toEqual(['poisson', 'negbin']);
    const items = doc.appendix.blocks[0].kind === 'list' ? doc.appendix.blocks[0].items : [];
    expect(items).toContain(`Project file: p.tallywise, SHA-256 ${'cd'.repeat(32)}.`);
    expect(doc.sections.map((s) => s.id)).toContain('cleaning');
    expect(doc.sheets.map((s) => s.name)).toEqual(['Trend summary', 'Indices', 'Coefficients', 'Audit log']);
  });

  it('draws the rootogram and the residuals of the chosen model, and counts residuals outside -2..2 over all records', () => {
    const spec = parseModelSpec({ ...shipsSpec, time: undefined });
    const fit = fitModel(shipsTable(), spec);
    const d = groupDiagnostics(fit, 'Poisson');
    const blocks = diagnosticsBlocks('g', 'incidents', d);
    const charts = blocks.filter((b): b is ChartBlock => b.kind === 'chart');
    expect(charts.map((c) => c.id)).toEqual(['g-rootogram', 'g-residuals']);
    for (const c of charts) expect(renderChartSvg(c.option, c.width, c.height)).toMatch(/^<svg[\s\S]*<\/svg>$/);
    const outside = Array.from(d.residuals.residual).filter((r) => Math.abs(r) > 2).length;
    const reading = blocks[3] as ParagraphBlock;
    expect(reading.text.startsWith(`${outside} of ${fit.y.length} residuals`)).toBe(true);
    expect(reading.cites).toEqual(['quantileResiduals']);
  });

  it('draws an even subsample of a large residual cloud, saying so, but counts every record', () => {
    const n = 5 * MAX_RESIDUAL_POINTS + 3;
    const rows = Array.from({ length: n }, (_v, i) => [String((i * 7) % 5), String(i % 3)]);
    const spec = parseModelSpec({ response: 'y', distribution: 'poisson', predictors: [{ column: 'x', type: 'factor' }], offsets: [] });
    const d = groupDiagnostics(fitModel(tableFromTexts(['y', 'x'], rows), spec), 'Poisson');
    const blocks = diagnosticsBlocks('g', 'y', d);
    const chart = blocks[2] as ChartBlock;
    const drawn = (chart.option.series as { data: unknown[] }[])[0].data.length;
    expect(drawn).toBe(Math.ceil(n / 6));
    expect((blocks[3] as ParagraphBlock).text).toMatch(new RegExp(`of ${n} residuals[\\s\\S]*every 6th record`));
  });
});
