/**
 * A report set against the last one in the project's history: what changed
 * in its inputs (the cleaned records, the models, the species), how each
 * species' trend and indices moved, and, when nothing changed, whether the
 * numbers came out the same ("reproduced exactly") or which differ.
 *
 *   compareWithLast(previous, current) -> SinceLast
 *
 * Numbers are compared as stored (src-shared/project/report-history.ts):
 * equal bit for bit is "exact"; a difference no larger than one part in a
 * billion is "rounding" (the last digits of a computation done on another
 * machine or build); more than that "differs".
 */
import { canonicalJson } from '../analysis/canonical-json';
import type { HistoryComposite, HistoryIndex, HistorySpecies, ReportHistoryEntry, ReportRecord } from '../project/report-history';

/** Relative difference still counted as rounding, not as a different result. */
export const ROUNDING = 1e-9;

export type Agreement = 'exact' | 'rounding' | 'differs';

/** One number that differs between two runs of the same data and models. */
export interface NumberDifference {
  /** The species' printed name, or "composite". */
  readonly subject: string;
  /** "trend a season", "lower limit of the trend", "index 2015", "AIC" ... */
  readonly quantity: string;
  readonly then: number | string | boolean | null;
  readonly now: number | string | boolean | null;
}

export interface IndexMove {
  readonly season: number | string;
  readonly then: number;
  readonly now: number;
}

export interface SpeciesSince {
  readonly species: string;
  readonly name: string;
  readonly then: HistorySpecies;
  readonly now: HistorySpecies;
  /** The model (name, spec, offset rows) is the same as last time. */
  readonly sameModel: boolean;
  /** The seasons both reports have an index for. */
  readonly sharedSeasons: readonly (number | string)[];
  /** The largest change of an index over the shared seasons (null when none is shared; then = now when none moved). */
  readonly largestMove: IndexMove | null;
}

export type Verdict =
  /** Same data and models, every number the same. */
  | 'exact'
  /** Same data and models, numbers the same but for the last digits. */
  | 'rounding'
  /** Same data and models for some species (or all), and some numbers differ. */
  | 'differs'
  /** Same data; the models or species changed, and the unchanged ones gave the same numbers. */
  | 'models-changed'
  /** The cleaned records changed (or their key is not known): numbers are expected to move. */
  | 'data-changed';

export interface SinceLast {
  readonly previous: Pick<ReportHistoryEntry, 'madeAt' | 'software' | 'files' | 'dataKey'>;
  readonly verdict: Verdict;
  /** What changed in the inputs, as plain sentences (empty when nothing did). */
  readonly changes: readonly string[];
  readonly species: readonly SpeciesSince[];
  readonly added: readonly string[];
  readonly dropped: readonly string[];
  /** Numbers that differ where the data and the model are the same as last time. */
  readonly differences: readonly NumberDifference[];
  /** The composite then and now, when both reports had one. */
  readonly composite: { readonly then: HistoryComposite; readonly now: HistoryComposite; readonly largestMove: IndexMove | null } | null;
}

const nameOf = (s: HistorySpecies) => s.label ?? s.species;
const sameModel = (a: HistorySpecies, b: HistorySpecies) => a.model.name === b.model.name && a.model.dropBadOffsetRows === b.model.dropBadOffsetRows && canonicalJson(a.model.spec) === canonicalJson(b.model.spec);
const seasonKey = (s: number | string) => `${typeof s}:${s}`;

function agreement(a: unknown, b: unknown): Agreement {
  if (Object.is(a, b)) return 'exact';
  if (typeof a === 'number' && typeof b === 'number' && Math.abs(a - b) <= ROUNDING * Math.max(1, Math.abs(a), Math.abs(b))) return 'rounding';
  return 'differs';
}

/** Largest |now - then| of the index over the seasons both have (finite indices only). */
function largestMove(then: readonly HistoryIndex[], now: readonly HistoryIndex[]): IndexMove | null {
  const before = new Map(then.map((r) => [seasonKey(r.season), r]));
  let best: IndexMove | null = null;
  for (const r of now) {
    const t = before.get(seasonKey(r.season));
    if (!t || t.index === null || r.index === null) continue;
    if (!best || Math.abs(r.index - t.index) > Math.abs(best.now - best.then)) best = { season: r.season, then: t.index, now: r.index };
  }
  return best;
}

function sharedSeasons(then: readonly HistoryIndex[], now: readonly HistoryIndex[]): (number | string)[] {
  const before = new Set(then.map((r) => seasonKey(r.season)));
  return now.filter((r) => before.has(seasonKey(r.season))).map((r) => r.season);
}

/** Every stored number of two runs that should agree, pairwise, with what each one is. */
function pairs(then: HistorySpecies, now: HistorySpecies): { quantity: string; then: NumberDifference['then']; now: NumberDifference['now'] }[] {
  const a = then.result;
  const b = now.result;
  if (!a || !b) return [{ quantity: 'whether the trend could be fitted', then: a ? 'fitted' : `not fitted (${then.error ?? ''})`, now: b ? 'fitted' : `not fitted (${now.error ?? ''})` }];
  const out: { quantity: string; then: NumberDifference['then']; now: NumberDifference['now'] }[] = [
    { quantity: 'trend a season', then: a.trend.perSeason, now: b.trend.perSeason },
    { quantity: 'lower limit of the trend', then: a.trend.lower, now: b.trend.lower },
    { quantity: 'upper limit of the trend', then: a.trend.upper, now: b.trend.upper },
    { quantity: 'theta', then: a.theta, now: b.theta },
    { quantity: 'AIC', then: a.aic, now: b.aic },
    { quantity: 'rows fitted', then: a.rows, now: b.rows },
    { quantity: 'convergence', then: a.converged, now: b.converged },
    { quantity: 'base season', then: a.base, now: b.base },
  ];
  return [...out, ...indexPairs(a.indices, b.indices)];
}

function indexPairs(then: readonly HistoryIndex[], now: readonly HistoryIndex[]): { quantity: string; then: NumberDifference['then']; now: NumberDifference['now'] }[] {
  const seasons = (rows: readonly HistoryIndex[]) => rows.map((r) => String(r.season)).join(', ');
  if (seasons(then) !== seasons(now)) return [{ quantity: 'seasons with an index', then: seasons(then), now: seasons(now) }];
  return then.flatMap((t, i) => {
    const n = now[i];
    return [
      { quantity: `index ${t.season}`, then: t.index, now: n.index },
      { quantity: `lower limit of index ${t.season}`, then: t.lower, now: n.lower },
      { quantity: `upper limit of index ${t.season}`, then: t.upper, now: n.upper },
    ];
  });
}

/** The pairs that do not agree exactly, and the worst agreement found. */
function check(subject: string, list: { quantity: string; then: NumberDifference['then']; now: NumberDifference['now'] }[]): { worst: Agreement; differences: NumberDifference[] } {
  let worst: Agreement = 'exact';
  const differences: NumberDifference[] = [];
  for (const p of list) {
    const a = agreement(p.then, p.now);
    if (a === 'differs') {
      worst = 'differs';
      differences.push({ subject, ...p });
    } else if (a === 'rounding' && worst === 'exact') worst = 'rounding';
  }
  return { worst, differences };
}

export function compareWithLast(previous: ReportHistoryEntry, current: ReportRecord): SinceLast {
  const changes: string[] = [];
  const sameData = previous.dataKey !== null && previous.dataKey === current.dataKey;
  if (!sameData) changes.push(previous.dataKey === null || current.dataKey === null ? 'The cleaned records cannot be matched with those of the last report (their key was not recorded).' : 'The cleaned records changed (records imported, corrected or left out).');
  const before = new Map(previous.species.map((s) => [s.species, s]));
  const nowNames = new Set(current.species.map((s) => s.species));
  const added = current.species.filter((s) => !before.has(s.species)).map(nameOf);
  const dropped = previous.species.filter((s) => !nowNames.has(s.species)).map(nameOf);
  if (added.length) changes.push(`Reported now but not then: ${added.join(', ')}.`);
  if (dropped.length) changes.push(`Reported then but not now: ${dropped.join(', ')}.`);
  const species: SpeciesSince[] = [];
  const differences: NumberDifference[] = [];
  let worst: Agreement = 'exact';
  for (const now of current.species) {
    const then = before.get(now.species);
    if (!then) continue;
    const same = sameModel(then, now);
    if (!same) changes.push(`The model of ${nameOf(now)} changed${then.model.name !== now.model.name ? ` ("${then.model.name}" then, "${now.model.name}" now)` : ' (its spec or the rows it leaves out)'}.`);
    const ti = then.result?.indices ?? [];
    const ni = now.result?.indices ?? [];
    species.push({ species: now.species, name: nameOf(now), then, now, sameModel: same, sharedSeasons: sharedSeasons(ti, ni), largestMove: largestMove(ti, ni) });
    if (sameData && same) {
      const c = check(nameOf(now), pairs(then, now));
      differences.push(...c.differences);
      if (c.worst === 'differs' || (c.worst === 'rounding' && worst === 'exact')) worst = c.worst;
    }
  }
  let composite: SinceLast['composite'] = null;
  if (previous.composite && current.composite) {
    composite = { then: previous.composite, now: current.composite, largestMove: largestMove(previous.composite.indices, current.composite.indices) };
    const settingsSame = previous.composite.replicates === current.composite.replicates && previous.composite.seed === current.composite.seed;
    if (!settingsSame) changes.push(`The composite's bootstrap settings changed (${previous.composite.replicates} replicates, seed ${previous.composite.seed} then; ${current.composite.replicates}, seed ${current.composite.seed} now).`);
    else if (sameData && !added.length && !dropped.length && species.every((s) => s.sameModel)) {
      const c = check('composite', indexPairs(previous.composite.indices, current.composite.indices));
      differences.push(...c.differences);
      if (c.worst === 'differs' || (c.worst === 'rounding' && worst === 'exact')) worst = c.worst;
    }
  } else if (!!previous.composite !== !!current.composite) changes.push(previous.composite ? 'The last report had a composite index; this one has none.' : 'This report has a composite index; the last one had none.');
  const verdict: Verdict = !sameData ? 'data-changed' : worst === 'differs' ? 'differs' : changes.length ? 'models-changed' : worst;
  return { previous: { madeAt: previous.madeAt, software: previous.software, files: previous.files, dataKey: previous.dataKey }, verdict, changes, species, added, dropped, differences, composite };
}
