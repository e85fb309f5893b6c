/**
 * The import's findings still open on each cleaned record. The rule is the
 * Records stage's (its flags panel): a finding is dealt with for a record
 * once the record is left out, or once the field it is about differs from
 * the import (edited, merged, converted); a whole-visit finding (no field)
 * only by leaving out.
 */
import type { CleaningRecord } from '../cleaning/record';
import type { LoadedSource } from '../host/contract';

export function openFlagsByRecord(sources: readonly LoadedSource[], raw: readonly CleaningRecord[], cleaned: readonly CleaningRecord[]): Map<string, string[]> {
  const rawById = new Map(raw.map((r) => [r.id, r]));
  const cleanedById = new Map(cleaned.map((r) => [r.id, r]));
  const out = new Map<string, string[]>();
  for (const s of sources) {
    for (const f of s.findings) {
      for (const id of f.recordIds) {
        const c = cleanedById.get(id);
        if (!c || c.excluded !== undefined) continue;
        const r = rawById.get(id);
        if (f.field && r && c.fields[f.field] !== r.fields[f.field]) continue;
        const list = out.get(id);
        if (!list) out.set(id, [f.code]);
        else if (!list.includes(f.code)) list.push(f.code);
      }
    }
  }
  return out;
}
