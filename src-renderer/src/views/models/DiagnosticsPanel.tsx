import { useEffect, useState } from 'react';
import { EChart } from '../../components/EChart';
import type { ChartId, ChartResult } from './diagnostic-charts';
import { diagnosticChartsInWorker } from './diagnostics-client';
import { chartLabels, type FittedModel } from './fitted-model';
import { distributionNames } from './spec-draft';
import { clickHint, linkedCharts, linkedSeries, pointLabel, pointLink } from './diagnostics/point-records';
import { showRecords } from './diagnostics/record-link';
import { OutlierControls } from './diagnostics/OutlierControls';

/**
 * The diagnostic charts of one species: frequencies and zeros for all its
 * models; the rootogram, residuals (against fitted values, season and site),
 * QQ, mean–variance, influence by site and the outlier flags for the model
 * shown. Computed in the diagnostics worker; a newer request cancels an
 * older one. A click on a record or site point shows its records; so does
 * Enter on a point chosen with the arrow keys (components/EChart.tsx).
 */
type State = { state: 'working' } | { state: 'ready'; charts: ChartResult[] } | { state: 'failed'; message: string };

function slug(s: string): string {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');
}

/** Charts already drawn, by models and focus, so that coming back to the stage does not redraw them. */
const drawn = new Map<string, ChartResult[]>();
const DRAWN_KEPT = 12;

function remember(key: string, charts: ChartResult[]): void {
  drawn.delete(key);
  drawn.set(key, charts);
  while (drawn.size > DRAWN_KEPT) drawn.delete(drawn.keys().next().value as string);
}

export function DiagnosticsPanel({ species, models, focus, siteColumn, seasonColumn, effortColumn }: { species: string; models: readonly FittedModel[]; focus: number; siteColumn: string; seasonColumn: string; effortColumn?: string }) {
  const key = `${models.map((m) => `${m.id}@${m.fittedAt}`).join('|')}#${focus}`;
  const [state, setState] = useState<State>(() => {
    const known = drawn.get(key);
    return known ? { state: 'ready', charts: known } : { state: 'working' };
  });
  // Charts are put up after the stage has been painted, so that arriving on the stage is quick.
  const [painted, setPainted] = useState(false);
  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(() => (timer = setTimeout(() => setPainted(true), 0)));
    return () => {
      cancelAnimationFrame(frame);
      clearTimeout(timer);
    };
  }, []);
  useEffect(() => {
    if (!models.length) return;
    const known = drawn.get(key);
    if (known) {
      setState({ state: 'ready', charts: known });
      return;
    }
    const labels = chartLabels(models, (x) => distributionNames[x.spec.distribution]);
    const controller = new AbortController();
    setState({ state: 'working' });
    diagnosticChartsInWorker(
      { models: models.map((m, k) => ({ label: labels[k], outcome: m.outcome, spec: m.spec })), focus, table: (models[focus] ?? models[0]).table, siteColumn, seasonColumn, ...(effortColumn ? { effortColumn } : {}) },
      { signal: controller.signal },
    )
      .then((charts) => {
        remember(key, charts);
        setState({ state: 'ready', charts });
      })
      .catch((err: Error) => {
        if (err.name !== 'FitCancelled') setState({ state: 'failed', message: err.message });
      });
    return () => controller.abort();
  }, [key, models, focus, siteColumn, seasonColumn, effortColumn]);

  const shown = models[focus] ?? models[0];
  const columns = { site: siteColumn, season: seasonColumn };
  const onPoint = (id: ChartId) => (data: unknown) => {
    const link = shown ? pointLink(id, data, shown.table, columns, species) : null;
    if (link) showRecords(link);
  };
  const keysOf = (id: ChartId) => ({
    seriesIds: linkedSeries[id] ?? [],
    describe: (p: { data: unknown }) => (shown ? pointLabel(id, p.data, shown.table, columns, species) : null),
    action: id === 'influence' || id === 'mean-variance' ? "shows the site's records" : 'shows its records',
  });

  return (
    <section className="diagnostics" aria-labelledby="diagnostics-heading">
      <h2 id="diagnostics-heading">Diagnostics</h2>
      <p className="hint">
        These charts check whether the model describes the counts; they say nothing about detection or changes in effort, which can bias a trend. Have a statistician look over the model choice.
      </p>
      <p className="hint" data-testid="keyboard-route">
        Without a mouse: Tab to a chart with points, choose a point with the arrow keys and press Enter to see its records on the Records stage; the improbable totals below have their own button.
      </p>
      {shown && <OutlierControls species={species} model={shown.label} dataKey={shown.dataKey} outcome={shown.outcome} table={shown.table} siteColumn={siteColumn} seasonColumn={seasonColumn} />}
      {(state.state === 'working' || (state.state === 'ready' && !painted)) && <p className="status" role="status">Drawing the diagnostic charts…</p>}
      {state.state === 'failed' && (
        <p className="problem" role="alert">
          The diagnostic charts could not be drawn: {state.message}
        </p>
      )}
      {state.state === 'ready' && painted && (
        <div className="chart-grid">
          {state.charts.map((c) =>
            'option' in c ? (
              <EChart
                key={c.id}
                option={c.option}
                fileName={`${slug(species)}-${c.id}`}
                testId={`chart-${c.id}`}
                {...(linkedCharts.has(c.id) ? { onPointClick: onPoint(c.id), hint: clickHint(c.id), keyboard: keysOf(c.id) } : {})}
              />
            ) : (
              <p key={c.id} className="chart-problem" data-testid={`chart-${c.id}`}>
                {c.problem}
              </p>
            ),
          )}
        </div>
      )}
    </section>
  );
}
