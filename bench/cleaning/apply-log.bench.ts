/**
 * Speed of replaying the cleaning log: 200,000 records and 5,000 entries of
 * every kind. Run with `npx vitest bench --project unit bench/cleaning`.
 * Prints the replay time as a ratio to one shallow copy of every record
 * (the least work any replay that copies its records could do).
 * A name merge costs in proportion to the records it renames, so a log of
 * nothing but merges of large groups is slower than this mix.
 */
import { bench, describe } from 'vitest';
import { applyLog } from '@shared/cleaning/apply-log';
import { appendEdit, emptyLog } from '@shared/cleaning/edit-log';
import type { EditDraft, EditLog } from '@shared/cleaning/edit-entry';
import type { CleaningRecord } from '@shared/cleaning/record';
import { createRng } from '@shared/demo/prng';

const N = 200_000;
const M = 5_000;
const rng = createRng(2026);
const rand = () => rng.uniform();
const sites = Array.from({ length: 400 }, (_, i) => `Site ${i}`);
const raw: CleaningRecord[] = Array.from({ length: N }, (_, i) => ({
  id: `r${i}`,
  fields: { site: sites[i % sites.length], species: `sp${i % 37}`, count: Math.floor(rand() * 20), effort: 30 + (i % 90) },
}));

function randomId(): string {
  return `r${Math.floor(rand() * N)}`;
}

let log: EditLog = emptyLog();
for (let k = 0; k < M; k++) {
  const u = rand();
  let d: EditDraft;
  if (u < 0.6) d = { kind: 'set-value', recordId: randomId(), field: 'count', old: null, new: k };
  else if (u < 0.8) d = { kind: 'exclude', recordIds: [randomId(), randomId()], reason: 'bench' };
  else if (u < 0.9) d = { kind: 'convert-unit', field: 'effort', recordIds: Array.from({ length: 20 }, randomId), factor: 1 / 60 };
  else d = { kind: 'merge-name', field: 'site', from: sites[Math.floor(rand() * sites.length)], into: sites[Math.floor(rand() * sites.length)] };
  log = appendEdit(log, d);
}

describe(`applyLog: ${N} records, ${M} entries`, () => {
  bench('baseline: shallow copy of every record', () => {
    raw.map((r) => ({ ...r, fields: { ...r.fields } }));
  });
  bench('applyLog', () => {
    applyLog(raw, log);
  });
});
