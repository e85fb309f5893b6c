import type { JobProgress } from '@shared/host/contract';
import type { ReadPlace } from '../import/import-file';

/** One import progress event, before the job id is put on it. */
export type ImportProgress = Omit<JobProgress, 'jobId'>;

/** Where each stage starts, as a fraction of the whole import (reading the cells is most of it). */
const stageStart = { 'reading-file': 0, 'reading-sheet': 0.02, checking: 0.6, building: 0.8, done: 1 } as const;
/** The share of reading given to the sheets kept beside the records (a site list), when there are any. */
const keptShare = 0.1;

/**
 * Turns the reader's callbacks into ordered import progress events: the
 * records' sheets, then the kept sheets, counted as sheet n of m together.
 */
export function importReporter(onProgress: ((p: ImportProgress) => void) | undefined, keptSheets: number) {
  const send = onProgress ?? (() => {});
  const reading = stageStart.checking - stageStart['reading-sheet'];
  const recordsShare = keptSheets ? reading * (1 - keptShare) : reading;
  let recordSheets = 1;
  const sheet = (from: number, share: number, kept: boolean) => (f: number, _stage: string, at?: ReadPlace) => {
    if (!at) return;
    if (!kept) recordSheets = at.sheetCount;
    const sheetIndex = kept ? recordSheets + at.sheetIndex : at.sheetIndex;
    send({ stage: 'reading-sheet', fraction: from + share * f, sheet: at.sheet, sheetIndex, sheetCount: recordSheets + keptSheets, rowsRead: at.rows });
  };
  return {
    stage: (stage: ImportProgress['stage']) => send({ stage, fraction: stageStart[stage] }),
    records: sheet(stageStart['reading-sheet'], recordsShare, false),
    kept: sheet(stageStart['reading-sheet'] + recordsShare, reading - recordsShare, true),
  };
}
