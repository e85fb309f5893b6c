import type { DataTable } from '@shared/data/table';
import type { FitOutcome } from '@shared/engine/types';
import type { ModelSpec } from '@shared/model/spec';
import { countFrequencies, hangingRootogram, influenceCoefficient, meanVarianceBySite, qqEnvelope, quantileResiduals, residualGroups, siteInfluenceOneStep, zeroCounts, type LabelledFit } from '@shared/diagnostics';
import { frequencyChart, influenceChart, meanVarianceChart, qqChart, residualsByGroupChart, residualsVsFittedChart, rootogramChart, zerosChart, type ChartOption } from '@shared/charts';
import type { CallContext } from '@shared/worker/port';

/**
 * The diagnostic charts of one species: the statistics come from
 * src-shared/diagnostics and the echarts options from src-shared/charts;
 * this only puts them together. Runs in the diagnostics worker (the QQ
 * envelope simulates 99 data sets).
 */
export type ChartId = 'frequencies' | 'rootogram' | 'residuals' | 'residuals-season' | 'residuals-site' | 'qq' | 'mean-variance' | 'influence' | 'zeros';

export const chartIds: readonly ChartId[] = ['frequencies', 'rootogram', 'residuals', 'residuals-season', 'residuals-site', 'qq', 'mean-variance', 'influence', 'zeros'];

export interface ChartRequest {
  readonly models: readonly { readonly label: string; readonly outcome: FitOutcome; readonly spec: ModelSpec }[];
  /** The model the single-model charts (rootogram, residuals, QQ, mean–variance, influence) are drawn for. */
  readonly focus: number;
  /** The species' table (the rows of every model index into it). */
  readonly table: DataTable;
  readonly siteColumn: string;
  readonly seasonColumn: string;
  readonly effortColumn?: string;
}

export type ChartResult = { readonly id: ChartId; readonly option: ChartOption } | { readonly id: ChartId; readonly problem: string };

/** Every category label shown, broken onto lines (echarts hides labels that would overlap, e.g. model names). */
function allCategoryLabels(option: ChartOption): ChartOption {
  const axis = option.xAxis as Record<string, unknown> | undefined;
  if (!axis || Array.isArray(axis)) return option;
  return { ...option, xAxis: { ...axis, axisLabel: { ...(axis.axisLabel as object | undefined), interval: 0, width: 120, overflow: 'break' } } } as ChartOption;
}

function attempt(id: ChartId, make: () => ChartOption): ChartResult {
  try {
    return { id, option: make() };
  } catch (err) {
    return { id, problem: err instanceof Error ? err.message : String(err) };
  }
}

export function diagnosticCharts(req: ChartRequest, ctx?: Pick<CallContext, 'onProgress' | 'signal'>): ChartResult[] {
  const fits: LabelledFit[] = req.models.map((m) => ({ label: m.label, fit: m.outcome }));
  const focus = req.models[req.focus] ?? req.models[0];
  const focusFit = focus.outcome;
  const out: ChartResult[] = [];
  let freq: ReturnType<typeof countFrequencies> | null = null;
  out.push(attempt('frequencies', () => frequencyChart((freq = countFrequencies(fits)))));
  out.push(
    attempt('rootogram', () => {
      const f = freq ?? countFrequencies(fits);
      return rootogramChart(hangingRootogram(f, focus.label), Math.max(0, req.focus));
    }),
  );
  ctx?.onProgress(0.2, 'residuals');
  const residuals = (() => {
    try {
      return quantileResiduals(focusFit, { seed: 1 });
    } catch (err) {
      return err instanceof Error ? err : new Error(String(err));
    }
  })();
  out.push(attempt('residuals', () => {
    if (residuals instanceof Error) throw residuals;
    return residualsVsFittedChart(residuals, focus.label);
  }));
  for (const [id, column] of [['residuals-season', req.seasonColumn], ['residuals-site', req.siteColumn]] as const) {
    out.push(attempt(id, () => {
      if (residuals instanceof Error) throw residuals;
      return residualsByGroupChart(residuals, residualGroups(residuals, req.table, column), focus.label);
    }));
  }
  out.push(attempt('qq', () => {
    if (residuals instanceof Error) throw residuals;
    return qqChart(qqEnvelope(focusFit, residuals, { simulations: 99, control: ctx && { onProgress: (f, s) => ctx.onProgress(0.3 + 0.5 * f, s), signal: ctx.signal } }), focus.label);
  }));
  // The negative-binomial curve comes from the model shown, or else from a fitted plain NB model of the species
  // (a zero-inflated or hurdle theta is that of the count part only, not of the counts' variance).
  const hasTheta = (m: ChartRequest['models'][number]) => m.outcome.theta !== null && m.outcome.theta > 0;
  const withTheta = hasTheta(focus) ? focus : req.models.find((m) => m.outcome.distribution === 'negbin' && hasTheta(m));
  out.push(
    attempt('mean-variance', () =>
      meanVarianceChart(
        meanVarianceBySite(req.table, { ...focusFit, theta: withTheta?.outcome.theta ?? null }, { siteColumn: req.siteColumn, ...(req.effortColumn ? { effortColumn: req.effortColumn } : {}) }),
        withTheta && withTheta !== focus ? withTheta.label : undefined,
      ),
    ),
  );
  ctx?.onProgress(0.85, 'influence by site');
  out.push(
    attempt('influence', () => {
      const coefficient = influenceCoefficient(focus.spec, focusFit.betaNames);
      if (!coefficient) throw new Error('The model has no coefficient besides the intercept and the site effects, so there is no trend whose change by site could be shown.');
      return influenceChart(siteInfluenceOneStep(req.table, focus.spec, focusFit, { coefficient: coefficient.name, siteColumn: req.siteColumn }), coefficient.meaning);
    }),
  );
  out.push(attempt('zeros', () => allCategoryLabels(zerosChart(zeroCounts(fits)))));
  return out;
}
