import type { DataTable } from '@shared/data/table';
import { findColumn } from '@shared/data/table';
import type { FitOutcome } from '@shared/engine/types';
import { outlierFlags } from '@shared/diagnostics';
import { keyOfRow, type RecordKey } from './diagnostics/record-key';

/**
 * Model-based outlier flags for the cleaning grid, computed in the
 * diagnostics worker: the analysis rows whose count total is improbable
 * under the model (src-shared/diagnostics/outlier-flags.ts), each with the
 * site, season and species that find its visit records again.
 */
export interface OutlierRequest {
  readonly outcome: FitOutcome;
  readonly table: DataTable;
  readonly threshold: number;
  readonly siteColumn: string;
  readonly seasonColumn: string;
}

export interface RowOutlier {
  readonly key: RecordKey;
  readonly count: number;
  readonly expected: number;
  readonly probability: number;
  readonly tail: 'upper' | 'lower';
  /** Visits summed into the row (null when the table does not say). */
  readonly visits: number | null;
}

export interface OutlierResult {
  readonly threshold: number;
  readonly rowsChecked: number;
  readonly flags: RowOutlier[];
  readonly expectedByChance: number;
  readonly note: string | null;
}

export function modelOutliers(req: OutlierRequest): OutlierResult {
  const out = outlierFlags(req.outcome, { threshold: req.threshold });
  const visits = findColumn(req.table, 'visits');
  return {
    threshold: out.threshold,
    rowsChecked: req.outcome.rows.length,
    expectedByChance: out.expectedByChance,
    note: out.note,
    flags: out.flags.map((f) => ({
      key: keyOfRow(req.table, f.row, { site: req.siteColumn, season: req.seasonColumn }),
      count: f.y,
      expected: f.expected,
      probability: f.probability,
      tail: f.tail,
      visits: visits?.numeric ? visits.values[f.row] : null,
    })),
  };
}
