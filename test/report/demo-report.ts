/**
 * A full report of the demo programme (invented data, src-shared/demo) with
 * every optional part: per species the trend, the models compared and the
 * one chosen (a zero-inflated NB for the natterjack, whose simulation plants
 * extra zeros; the demo spec's NB for the others), the diagnostics and the
 * data summary, plus a small invented cleaning log with a site named as
 * markup. Shared by the PDF, XLSX, LibreOffice and Chromium tests.
 */
import type { EditLog } from '@shared/cleaning/edit-entry';
import { splitBy } from '@shared/data/table';
import { analysisDataTable } from '@shared/demo/analysis-table';
import { buildDemo } from '@shared/demo/build';
import { DEMO_TRUTH } from '@shared/demo/truth';
import { parseModelSpec, type ModelSpec } from '@shared/model/spec';
import { buildTrendReport } from '@shared/report/build';
import type { GroupTrend } from '@shared/report/group-section';
import { groupReportParts } from '@shared/report/group-parts';
import type { ReportDocument } from '@shared/report/model';
import { decisionFlags } from '@shared/trend/flags';
import { analyseTrend } from '@shared/trend/trend-analysis';
import demoSpecJson from '../../resources/demo/trend-spec.json';
import { MARKUP } from './ships-report';

const T = '2026-01-05T09:00:00.000Z';

export const DEMO_LOG: EditLog = {
  entries: [
    { id: 'e1', time: T, author: 'analyst', kind: 'merge-name', field: 'site', from: `${MARKUP} `, into: MARKUP, reason: 'trailing space in the site name' },
    { id: 'e2', time: T, author: 'analyst', kind: 'set-value', recordId: 'r17', field: 'count', old: 410, new: 41, reason: 'typing slip: the paper sheet says 41' },
    { id: 'e3', time: T, author: 'analyst', kind: 'exclude', recordIds: ['r40', 'r41'], reason: 'pond dry on the visit date' },
    { id: 'e4', time: T, author: 'analyst', kind: 'convert-unit', field: 'effort', recordIds: ['r50', 'r51', 'r52'], factor: 1 / 60, fromUnit: 'seconds', toUnit: 'minutes', reason: 'sheet recorded seconds' },
  ],
  cursor: 4,
  nextSeq: 5,
};

export interface DemoReport {
  readonly doc: ReportDocument;
  readonly groups: readonly GroupTrend[];
}

function candidates(key: string, spec: ModelSpec): { chosen: { label: string; spec: ModelSpec }; others: { label: string; spec: ModelSpec }[] } {
  const nb = { label: 'Negative binomial, pond effects', spec };
  const poisson = { label: 'Poisson, pond effects', spec: parseModelSpec({ ...spec, distribution: 'poisson' }) };
  if (key !== 'natterjack') return { chosen: nb, others: [poisson] };
  const zinb = { label: 'Zero-inflated NB, pond effects', spec: parseModelSpec({ ...spec, distribution: 'zinb', zeroPredictors: [] }) };
  return { chosen: zinb, others: [poisson, nb] };
}

let cached: Promise<DemoReport> | undefined;

export function demoReport(): Promise<DemoReport> {
  cached ??= (async () => {
    const table = analysisDataTable(buildDemo().clean);
    const spec = parseModelSpec(demoSpecJson);
    const groups: GroupTrend[] = [];
    for (const g of splitBy(table, 'species')) {
      const { chosen, others } = candidates(g.key, spec);
      const result = await analyseTrend(g.table, chosen.spec);
      const label = DEMO_TRUTH.species.find((s) => s.key === g.key)?.label;
      groups.push({ group: g.key, label, result, flags: decisionFlags(result.slope), ...groupReportParts(g.table, chosen, others, { reason: 'lowest AIC, and the rootogram shows the zeros right.' }) });
    }
    const doc = buildTrendReport({
      title: 'Quillbrook Basin Pond Call Survey: trend report (demo)',
      subtitle: 'Invented programme; counts simulated from known trends',
      spec,
      groupColumn: 'species',
      groups,
      cleaning: DEMO_LOG,
      provenance: {
        software: { name: 'Tallywise', version: '0.0.0-test' },
        inputs: [{ name: 'season-2012.xlsx', sha256: 'ef'.repeat(32) }],
        project: { name: 'quillbrook.tallywise', sha256: '12'.repeat(32) },
        seeds: [{ what: 'the demo simulation', value: 1 }],
        createdAt: T,
      },
    });
    return { doc, groups };
  })();
  return cached;
}
