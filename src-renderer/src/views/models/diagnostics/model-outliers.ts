import { useSyncExternalStore } from 'react';
import type { CleaningRecord } from '@shared/cleaning/record';
import type { OutlierResult, RowOutlier } from '../diagnostics-outliers';
import { keyOfRecord, keyText } from './record-key';

/**
 * The model-based outlier flags last worked out on the Models stage (for
 * the model shown there), kept for the cleaning grid. The flags are on
 * analysis rows (site x season x species, visits summed); each visit record
 * behind a flagged row carries the flag, and its wording says so. Flags are
 * for review: nothing is left out or changed by them.
 */
export interface ModelOutliers {
  readonly species: string;
  readonly model: string;
  readonly result: OutlierResult;
  /** Key of the cleaned data the model was fitted to (see dataKey): the flags are out of date under another. */
  readonly dataKey: string;
  /** Flagged rows by keyText(site, season, species). */
  readonly byKey: ReadonlyMap<string, RowOutlier>;
}

let current: ModelOutliers | null = null;
const listeners = new Set<() => void>();

export function modelOutliersOf(species: string, model: string, result: OutlierResult, dataKey: string): ModelOutliers {
  return { species, model, result, dataKey, byKey: new Map(result.flags.map((f) => [keyText(f.key), f])) };
}

export function publishModelOutliers(species: string, model: string, result: OutlierResult, dataKey: string): void {
  current = modelOutliersOf(species, model, result, dataKey);
  for (const l of listeners) l();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function useModelOutliers(): ModelOutliers | null {
  return useSyncExternalStore(subscribe, () => current);
}

export function outlierOf(outliers: ModelOutliers | null, r: CleaningRecord): RowOutlier | undefined {
  if (!outliers || r.excluded !== undefined) return undefined;
  return outliers.byKey.get(keyOfRecord(r));
}

/** A probability as a short statement: "p = 0.00031", "p = 2.1e-7", "p < 1e-300" (below what a double holds). */
export function probabilityText(p: number): string {
  if (p === 0) return 'p < 1e-300';
  return `p = ${p >= 1e-4 ? String(Number(p.toPrecision(2))) : p.toExponential(1)}`;
}

/** The flag's wording for a record behind a flagged row. */
export function outlierText(o: ModelOutliers, f: RowOutlier): string {
  const where = `${f.key.site ?? ''}, season ${f.key.season ?? ''}`;
  const tail = f.tail === 'upper' ? `P(total ≥ ${f.count})` : `P(total ≤ ${f.count})`;
  const p = probabilityText(f.probability).slice(2);
  const visits = f.visits !== null ? `${f.visits} visit${f.visits === 1 ? '' : 's'} summed` : 'visits summed';
  return (
    `Improbable under "${o.model}": the season total at ${where} is ${f.count} (expected ${Number(f.expected.toPrecision(3))}), ${tail} ${p}. ` +
    `The flag is on the analysis row (${visits}); this record is one of its visits. For review only; nothing is left out.`
  );
}
