/**
 * The report's section "Since the last report" (placed after the summary)
 * and its spreadsheet sheet, from compareWithLast (since-last.ts): the last
 * report's date and files, whether this one reproduced it, what changed in
 * the inputs, each species' trend then and now with the seasons covered,
 * and the largest change of an index over the seasons both cover.
 */
import type { HistoryIndex, HistorySpecies } from '../project/report-history';
import type { Block, Cell, Section, SheetTable, TableBlock } from './model';
import { formatNumber, signedPercent } from './number-format';
import type { IndexMove, NumberDifference, SinceLast } from './since-last';

const INDEX = { kind: 'fixed', decimals: 1 } as const;
/** Differences listed in the section; the sheet has all of them. */
const LISTED = 20;

/** "2026-12-02 06:30 UTC" from an ISO time. */
export function madeOn(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}

const pct = (x: number | null) => (x === null ? '–' : signedPercent(x));

function trendText(s: HistorySpecies): string {
  const r = s.result;
  if (!r) return 'not fitted';
  return `${pct(r.trend.perSeason)} (${pct(r.trend.lower)} to ${pct(r.trend.upper)})`;
}

function seasonsText(rows: readonly HistoryIndex[]): string {
  if (!rows.length) return '–';
  return rows.length === 1 ? String(rows[0].season) : `${rows[0].season}–${rows[rows.length - 1].season} (${rows.length})`;
}

function moveText(m: IndexMove | null): string {
  if (!m) return 'no season in both';
  const d = m.now - m.then;
  if (d === 0) return 'none moved';
  return `${m.season}: ${formatNumber(m.then, INDEX)} then, ${formatNumber(m.now, INDEX)} now (${d >= 0 ? '+' : ''}${formatNumber(d, INDEX)})`;
}

const valueText = (v: NumberDifference['then']) => (v === null ? 'no value' : typeof v === 'number' ? String(v) : String(v));

/** A difference as one line: "Natterjack toad: AIC was 812.31, is 812.5". */
export function differenceLine(d: NumberDifference): string {
  return `${d.subject}: ${d.quantity} was ${valueText(d.then)}, is ${valueText(d.now)}`;
}

function lead(s: SinceLast): string {
  const when = `The last report was made on ${madeOn(s.previous.madeAt)} with ${s.previous.software.name} ${s.previous.software.version}.`;
  switch (s.verdict) {
    case 'exact':
      return `${when} The cleaned records and the model of every species are the same as then, and every number of this report is the same as in that one: reproduced exactly.`;
    case 'rounding':
      return `${when} The cleaned records and the model of every species are the same as then, and every number is the same but for its last digits (less than one part in a billion): reproduced, though not bit for bit.`;
    case 'differs':
      return `${when} The cleaned records are the same as then, yet ${s.differences.length === 1 ? 'one number differs' : `${s.differences.length} numbers differ`} where the model is the same too: not reproduced. The differences are listed below; check that the same version of Tallywise and the same project file were used.`;
    case 'models-changed':
      return `${when} The cleaned records are the same as then; what changed is listed below. Where the model did not change, the numbers are the same as then.`;
    case 'data-changed':
      return `${when} Since then the cleaned records changed, so the numbers are expected to move; how they moved is shown below.`;
  }
}

function comparisonTable(s: SinceLast): TableBlock {
  const rows: Cell[][] = s.species.map((x) => [x.name, seasonsText(x.then.result?.indices ?? []), trendText(x.then), seasonsText(x.now.result?.indices ?? []), trendText(x.now), moveText(x.largestMove)]);
  if (s.composite) rows.push(['Composite', seasonsText(s.composite.then.indices), 'no trend', seasonsText(s.composite.now.indices), 'no trend', moveText(s.composite.largestMove)]);
  return {
    kind: 'table',
    id: 'since-last-table',
    caption: 'Trend a season (95% limits) then and now, the seasons covered, and the largest change of an index over the seasons both reports cover',
    columns: [{ header: 'Species' }, { header: 'Seasons then' }, { header: 'Trend then' }, { header: 'Seasons now' }, { header: 'Trend now' }, { header: 'Largest index change' }],
    rows,
    notes: ['Indices are against the base season (= 100) of each report. A change of the base season changes every index.'],
  };
}

/** Why indices of seasons already reported can move. */
export const WHY_INDICES_MOVE =
  'Indices of seasons already reported move when a season is added or records are corrected: the model is fitted again to all seasons together, so the site effects, the dispersion and the season effects are estimated anew from every record, and a corrected or left-out count changes its own season and, through those shared estimates, the others. Small moves are expected; a large one points to a correction worth checking in the cleaning log.';

export function sinceLastSection(s: SinceLast): Section {
  const blocks: Block[] = [{ kind: 'paragraph', emphasis: true, text: lead(s) }];
  if (s.previous.files.length) blocks.push({ kind: 'paragraph', text: `It wrote ${s.previous.files.map((f) => `${f.name} (SHA-256 ${f.sha256.slice(0, 12)}…)`).join(', ')}.` });
  if (s.verdict === 'differs') {
    const items = s.differences.slice(0, LISTED).map(differenceLine);
    if (s.differences.length > LISTED) items.push(`… and ${s.differences.length - LISTED} more (all are on the "Since last report" sheet of the workbook).`);
    blocks.push({ kind: 'caution', title: 'Numbers that differ from the last report', items });
  }
  if (s.changes.length) blocks.push({ kind: 'list', title: 'What changed since the last report', items: [...s.changes] });
  if (s.species.length || s.composite) blocks.push(comparisonTable(s));
  if (s.verdict === 'data-changed' || s.verdict === 'models-changed') blocks.push({ kind: 'paragraph', text: WHY_INDICES_MOVE });
  return { id: 'since-last', heading: 'Since the last report', blocks };
}

/** Every compared number then and now, one row each, for the spreadsheet. */
export function sinceLastSheet(s: SinceLast): SheetTable {
  const rows: Cell[][] = [];
  const push = (subject: string, quantity: string, season: number | string | null, then: number | null | undefined, now: number | null | undefined) =>
    rows.push([subject, quantity, season, then ?? null, now ?? null, typeof then === 'number' && typeof now === 'number' ? now - then : null]);
  const indices = (subject: string, then: readonly HistoryIndex[], now: readonly HistoryIndex[]) => {
    const seasons = [...new Map([...then, ...now].map((r) => [`${typeof r.season}:${r.season}`, r.season])).values()];
    for (const season of seasons) {
      const t = then.find((r) => r.season === season);
      const n = now.find((r) => r.season === season);
      push(subject, 'index', season, t?.index, n?.index);
      push(subject, 'index lower 95%', season, t?.lower, n?.lower);
      push(subject, 'index upper 95%', season, t?.upper, n?.upper);
    }
  };
  for (const x of s.species) {
    const a = x.then.result;
    const b = x.now.result;
    push(x.name, 'trend a season', null, a?.trend.perSeason, b?.trend.perSeason);
    push(x.name, 'trend lower 95%', null, a?.trend.lower, b?.trend.lower);
    push(x.name, 'trend upper 95%', null, a?.trend.upper, b?.trend.upper);
    push(x.name, 'theta', null, a?.theta, b?.theta);
    push(x.name, 'AIC', null, a?.aic, b?.aic);
    indices(x.name, a?.indices ?? [], b?.indices ?? []);
  }
  if (s.composite) indices('Composite', s.composite.then.indices, s.composite.now.indices);
  const general = { kind: 'general' } as const;
  return {
    name: 'Since last report',
    table: {
      kind: 'table',
      id: 'sheet-since-last',
      caption: `Numbers of the last report (${madeOn(s.previous.madeAt)}) and of this one`,
      columns: [{ header: 'Species' }, { header: 'Quantity' }, { header: 'Season', format: general }, { header: 'Then', format: general }, { header: 'Now', format: general }, { header: 'Change', format: general }],
      rows,
      notes: [lead(s)],
    },
  };
}
