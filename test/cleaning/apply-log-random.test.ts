import { describe, expect, it } from 'vitest';
import { applyLog } from '@shared/cleaning/apply-log';
import { appendEdit, emptyLog, entryStatuses, redo, revertEntry, undo } from '@shared/cleaning/edit-log';
import type { EditDraft, EditEntry, EditLog } from '@shared/cleaning/edit-entry';
import type { CleaningRecord, FieldValue } from '@shared/cleaning/record';
import { createRng } from '@shared/demo/prng';
import { parseNumber } from '@shared/data/table';

// Seeded simulation: random edit histories (edits, undo, redo, reverts) are
// replayed by applyLog and by a deliberately naive replay written from the
// definitions in docs/project-format.md (every merge scans every record,
// cancellation decided recursively). The two must agree exactly.

type Plain = { id: string; fields: Record<string, FieldValue>; excluded?: string };

function isCancelled(log: EditLog, e: EditEntry, memo = new Map<string, boolean>()): boolean {
  if (memo.has(e.id)) return memo.get(e.id)!;
  const active = log.entries.slice(0, log.cursor);
  const result = active.some((r) => r.kind === 'revert' && r.target === e.id && !isCancelled(log, r, memo));
  memo.set(e.id, result);
  return result;
}

function naiveReplay(raw: readonly CleaningRecord[], log: EditLog): Plain[] {
  const recs: Plain[] = JSON.parse(JSON.stringify(raw));
  const find = (id: string) => recs.find((r) => r.id === id);
  for (const e of log.entries.slice(0, log.cursor)) {
    if (e.kind === 'revert' || isCancelled(log, e)) continue;
    if (e.kind === 'set-value') {
      const r = find(e.recordId);
      if (r) r.fields[e.field] = e.new;
    } else if (e.kind === 'exclude' || e.kind === 'include') {
      for (const id of e.recordIds) {
        const r = find(id);
        if (r && e.kind === 'exclude') r.excluded = e.reason;
        if (r && e.kind === 'include') delete r.excluded;
      }
    } else if (e.kind === 'merge-name') {
      for (const r of recs) if (r.fields[e.field] !== null && r.fields[e.field] !== undefined && String(r.fields[e.field]) === e.from) r.fields[e.field] = e.into;
    } else if (e.kind === 'convert-unit') {
      for (const id of e.recordIds) {
        const r = find(id);
        const v = r?.fields[e.field];
        const x = typeof v === 'number' ? v : typeof v === 'string' ? parseNumber(v) : Number.NaN;
        if (r && Number.isFinite(x)) r.fields[e.field] = x * e.factor;
      }
    }
  }
  return recs;
}

function randomHistory(seed: number) {
  const rng = createRng(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rng.uniform() * xs.length)];
  const sites = ['North', 'N.', 'north', 'South', 'S.', 'West', '12'];
  const raw: CleaningRecord[] = Array.from({ length: 120 }, (_, i) => ({
    id: `r${i}`,
    fields: { site: pick(sites), species: pick(['Teal', 'Coot']), count: i % 9 === 0 ? null : Math.floor(rng.uniform() * 30), effort: 10 + (i % 50) },
  }));
  const ids = [...raw.map((r) => r.id), 'r-missing'];
  let log = emptyLog();
  for (let step = 0; step < 200; step++) {
    const u = rng.uniform();
    if (u < 0.1) log = undo(log);
    else if (u < 0.15) log = redo(log);
    else if (u < 0.25) {
      const statuses = entryStatuses(log);
      const live = log.entries.filter((e) => statuses.get(e.id) === 'in-effect');
      if (live.length) log = revertEntry(log, pick(live).id);
    } else {
      const k = rng.uniform();
      let d: EditDraft;
      if (k < 0.35) d = { kind: 'set-value', recordId: pick(ids), field: pick(['site', 'count']), old: null, new: pick<FieldValue>([...sites, 3, null]) };
      else if (k < 0.55) d = { kind: 'merge-name', field: 'site', from: pick(sites), into: pick(sites) };
      else if (k < 0.7) d = { kind: 'exclude', recordIds: [pick(ids), pick(ids)], reason: `why ${step}` };
      else if (k < 0.8) d = { kind: 'include', recordIds: [pick(ids)] };
      else d = { kind: 'convert-unit', field: pick(['effort', 'count']), recordIds: [pick(ids), pick(ids), pick(ids)], factor: pick([60, 0.5, 1 / 60]) };
      log = appendEdit(log, d);
    }
  }
  return { raw, log };
}

describe('applyLog agrees with a naive replay on random histories', () => {
  for (const seed of [1, 2, 3, 4, 5, 6, 7, 8]) {
    it(`seed ${seed}`, () => {
      const { raw, log } = randomHistory(seed);
      const before = JSON.stringify(raw);
      const { records } = applyLog(raw, log);
      expect(JSON.parse(JSON.stringify(records))).toEqual(naiveReplay(raw, log));
      expect(JSON.stringify(raw)).toBe(before);
      expect(log.entries.length).toBeGreaterThan(50);
    });
  }
});
