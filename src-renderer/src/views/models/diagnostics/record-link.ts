import type { RecordKey } from './record-key';

/**
 * A request from a chart to show records in the cleaning grid: which
 * records (by site, season, species) and a label saying where the request
 * came from. The Records stage takes the pending request when it opens; the
 * shell listens to switch to that stage.
 */
export interface RecordLink {
  readonly label: string;
  readonly keys: readonly RecordKey[];
  /** Show the grid's "model outliers" filter instead of these keys. */
  readonly asOutliers?: boolean;
}

let pending: RecordLink | null = null;
const listeners = new Set<(link: RecordLink) => void>();

export function showRecords(link: RecordLink): void {
  pending = link;
  for (const l of listeners) l(link);
}

/** The request not yet shown, once. */
export function takeRecordLink(): RecordLink | null {
  const link = pending;
  pending = null;
  return link;
}

export function onRecordLink(listener: (link: RecordLink) => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}
