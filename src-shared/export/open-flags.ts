/**
 * The import's findings still open on each cleaned record, in the Records
 * stage's chip words ("no effort", "repeated row"), by the stage's own rule
 * (settledFor): dealt with once the record is left out, or once the field
 * the finding is about differs from the import (edited, merged, converted);
 * a whole-visit finding (no field) only by leaving out.
 */
import type { CleaningRecord } from '../cleaning/record';
import { flagLabel, settledFor } from '../cleaning/finding-flags';
import type { LoadedSource } from '../host/contract';

export function openFlagsByRecord(sources: readonly LoadedSource[], raw: readonly CleaningRecord[], cleaned: readonly CleaningRecord[]): Map<string, string[]> {
  const rawById = new Map(raw.map((r) => [r.id, r]));
  const cleanedById = new Map(cleaned.map((r) => [r.id, r]));
  const out = new Map<string, string[]>();
  for (const s of sources) {
    for (const f of s.findings) {
      for (const id of f.recordIds) {
        const c = cleanedById.get(id);
        if (!c || settledFor(f, c, rawById.get(id))) continue;
        const word = flagLabel(f.code);
        const list = out.get(id);
        if (!list) out.set(id, [word]);
        else if (!list.includes(word)) list.push(word);
      }
    }
  }
  return out;
}
