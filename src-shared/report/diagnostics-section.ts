/**
 * The main diagnostics of a group's chosen model for the report: the hanging
 * rootogram and the randomized quantile residuals against fitted values,
 * computed and drawn by the same statistics and chart builders as the
 * screen, with a plain reading of each.
 */
import { residualsVsFittedChart } from '../charts/residual-charts';
import { rootogramChart } from '../charts/rootogram-chart';
import { countFrequencies } from '../diagnostics/count-frequencies';
import type { FitForDiagnostics } from '../diagnostics/fitted-distribution';
import { quantileResiduals, type QuantileResiduals } from '../diagnostics/quantile-residuals';
import { hangingRootogram, type HangingRootogram } from '../diagnostics/rootogram';
import type { Block } from './model';
import { formatNumber } from './number-format';

export interface GroupDiagnostics {
  /** The model's label, as in the comparison. */
  readonly label: string;
  readonly rootogram: HangingRootogram;
  readonly residuals: QuantileResiduals;
}

/** The report diagnostics of one fit (seeded, so a rerun draws the same residuals). */
export function groupDiagnostics(fit: FitForDiagnostics, label: string, seed = 1): GroupDiagnostics {
  const rootogram = hangingRootogram(countFrequencies([{ label, fit }]));
  return { label, rootogram, residuals: quantileResiduals(fit, { seed }) };
}

export const DIAGNOSTIC_CHART_SIZE = { width: 760, height: 440 } as const;

/** A residual chart draws at most this many points; beyond it an even subsample (every k-th record) keeps the SVG small. */
export const MAX_RESIDUAL_POINTS = 2000;

function thinned(res: QuantileResiduals): QuantileResiduals {
  const n = res.residual.length;
  if (n <= MAX_RESIDUAL_POINTS) return res;
  const step = Math.ceil(n / MAX_RESIDUAL_POINTS);
  const pick = <T extends Float64Array | Int32Array>(a: T): T => a.filter((_v, i) => i % step === 0) as T;
  return { ...res, rows: pick(res.rows), y: pick(res.y), fitted: pick(res.fitted), residual: pick(res.residual), lower: pick(res.lower), upper: pick(res.upper) };
}

/** Worst bins of the rootogram: where the hanging bar ends farthest from zero. */
function rootogramReading(r: HangingRootogram): string {
  const worst = [...r.bins].sort((a, b) => Math.abs(b.bottom) - Math.abs(a.bottom)).slice(0, 2);
  const words = worst.map((b) => `${b.label} (${b.bottom < 0 ? 'too few expected' : 'too many expected'}, bar ends at ${formatNumber(b.bottom, { kind: 'fixed', decimals: 2 })})`);
  return `Largest gaps between the bars and zero: count ${words.join(' and count ')}. Gaps within about 1 on this square-root scale are usual for chance.`;
}

function residualReading(res: QuantileResiduals): string {
  const n = res.residual.length;
  let outside = 0;
  for (const r of res.residual) if (Math.abs(r) > 2) outside++;
  const share = n ? outside / n : 0;
  const verdict = share > 0.08 ? 'more than the about 5% expected when the model fits: look at those records and at the model' : 'close to the about 5% expected when the model fits';
  return `${outside} of ${n} residuals (${formatNumber(share, { kind: 'percent', decimals: 1 })}) lie outside -2 to 2: ${verdict}. A curve or a funnel in the cloud means the mean or the variance is wrong for some fitted values.`;
}

export function diagnosticsBlocks(id: string, subject: string, d: GroupDiagnostics): Block[] {
  const shown = thinned(d.residuals);
  const sub = shown === d.residuals ? '' : ` (every ${Math.ceil(d.residuals.residual.length / MAX_RESIDUAL_POINTS)}th record drawn)`;
  return [
    {
      kind: 'chart',
      id: `${id}-rootogram`,
      option: rootogramChart(d.rootogram),
      alt: `Hanging rootogram of "${d.label}" for ${subject}: for each count per record, a bar of the square root of the records observed hangs from the square root of those expected, against a zero line.`,
      ...DIAGNOSTIC_CHART_SIZE,
    },
    { kind: 'paragraph', text: rootogramReading(d.rootogram), cites: ['rootogram'] },
    {
      kind: 'chart',
      id: `${id}-residuals`,
      option: residualsVsFittedChart(shown, d.label),
      alt: `Scatter of the randomized quantile residuals of "${d.label}" for ${subject} against the fitted counts${sub}, with dashed lines at -2, 0 and 2.`,
      ...DIAGNOSTIC_CHART_SIZE,
    },
    { kind: 'paragraph', text: `${residualReading(d.residuals)}${sub ? ` The chart shows every ${Math.ceil(d.residuals.residual.length / MAX_RESIDUAL_POINTS)}th record; the count above uses all.` : ''}`, cites: ['quantileResiduals'] },
  ];
}
