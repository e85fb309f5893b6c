import { createRng, deriveSeed, pick, type Rng } from './prng';
import { dayFirstText } from './dates';
import { COLUMN, COUNTS_SHEET, FIRST_DATA_ROW, seasonFileName, type CountsDraft } from './season-sheet';
import { cellText, columnLetter, type SheetCell } from './sheet-grid';

/**
 * Plants the problems real tally sheets have into a few seasons' Counts
 * sheets, and records each one (where it is, what was written, what the
 * clean value is) so tests and the data checker can verify they are found.
 */
export type MessKind =
  | 'not-surveyed-code'
  | 'present-not-counted-code'
  | 'at-least-code'
  | 'pond-name-variant'
  | 'duplicated-row'
  | 'missing-minutes'
  | 'count-as-text'
  | 'date-as-text';

export interface MessStep {
  readonly season: number;
  readonly kind: MessKind;
  /** pond-name-variant: 'case-and-space' ("… pool ") or 'typo' (a doubled letter typed once); count-as-text: 'trailing-space' or 'plain'. */
  readonly style?: 'case-and-space' | 'typo' | 'trailing-space' | 'plain';
}

export interface PlantedProblem {
  readonly kind: MessKind;
  readonly season: number;
  readonly file: string;
  readonly sheet: string;
  /** 1-based Excel row. */
  readonly row: number;
  /** Column letter ('A' …). */
  readonly column: string;
  readonly header: string;
  /** The cell as written: its text, '' when blank. */
  readonly found: string;
  /** The clean value as text ('' when the row should go). */
  readonly shouldBe: string;
  /** The clean value: a count, minutes, pond name or ISO date; null when the row should be deleted. */
  readonly cleanValue: number | string | null;
  /** One plain sentence on the problem and its fix. */
  readonly note: string;
}

/** The count above which a tallier writes ">50" instead of a number. */
const AT_LEAST_LIMIT = 50;

/** The problems planted in the demo, by season (positions are drawn from the seed). */
export const MESS_PLAN: readonly MessStep[] = [
  { season: 2014, kind: 'not-surveyed-code' },
  { season: 2014, kind: 'not-surveyed-code' },
  { season: 2014, kind: 'count-as-text', style: 'trailing-space' },
  { season: 2016, kind: 'pond-name-variant', style: 'case-and-space' },
  { season: 2017, kind: 'present-not-counted-code' },
  { season: 2017, kind: 'present-not-counted-code' },
  { season: 2017, kind: 'missing-minutes' },
  { season: 2019, kind: 'duplicated-row' },
  { season: 2019, kind: 'date-as-text' },
  { season: 2021, kind: 'at-least-code' },
  { season: 2021, kind: 'pond-name-variant', style: 'typo' },
  { season: 2024, kind: 'not-surveyed-code' },
  { season: 2024, kind: 'count-as-text', style: 'plain' },
];

export interface MessResult {
  readonly drafts: CountsDraft[];
  readonly planted: PlantedProblem[];
}

/** Returns messy copies of the drafts (the inputs are not changed) and the list of what was planted. */
export function plantMess(drafts: readonly CountsDraft[], seed: number, plan: readonly MessStep[] = MESS_PLAN): MessResult {
  const out = drafts.map((d) => ({ ...d, rows: d.rows.map((r) => [...r]), visitOf: [...d.visitOf] }));
  const planted: PlantedProblem[] = [];
  for (const draft of out) {
    const steps = plan.filter((s) => s.season === draft.season);
    // Rows are inserted first, so every recorded row number is final.
    steps.sort((a, b) => Number(b.kind === 'duplicated-row') - Number(a.kind === 'duplicated-row'));
    const planter = new SeasonPlanter(draft, createRng(deriveSeed(seed, `mess-${draft.season}`)));
    for (const step of steps) planted.push(planter.plant(step));
  }
  return { drafts: out, planted };
}

class SeasonPlanter {
  private readonly used = new Set<string>();
  private readonly reservedRows = new Set<number>();
  private readonly speciesColumns: number[];

  constructor(private readonly draft: CountsDraft, private readonly rng: Rng) {
    const nSpecies = draft.visitOf.length > 0 ? draft.visitOf[0].counts.length : 0;
    this.speciesColumns = Array.from({ length: nSpecies }, (_, j) => COLUMN.firstSpecies + j);
  }

  plant(step: MessStep): PlantedProblem {
    switch (step.kind) {
      case 'duplicated-row':
        return this.duplicateRow();
      case 'not-surveyed-code':
        return this.replaceCount(step.kind, () => true, () => 'NS', (c) => `The species was not listened for on this visit: treat as missing, not as a count (the simulated count was ${c}).`);
      case 'present-not-counted-code':
        return this.replaceCount(step.kind, (c) => c > 0, () => 'x', (c) => `"x" means heard but not counted: treat as missing, or as at least 1 (the simulated count was ${c}).`);
      case 'count-as-text':
        return this.replaceCount(step.kind, (c) => c > 0, (c) => (step.style === 'plain' ? String(c) : `${c} `), (c) => `The count ${c} was typed as text: read it as the number ${c}.`);
      case 'at-least-code':
        return this.atLeast();
      case 'missing-minutes':
        return this.blankMinutes();
      case 'date-as-text':
        return this.dateAsText();
      case 'pond-name-variant':
        return this.pondVariant(step.style === 'typo' ? 'typo' : 'case-and-space');
    }
  }

  private record(kind: MessKind, index: number, column: number, found: SheetCell, cleanValue: number | string | null, note: string): PlantedProblem {
    this.used.add(`${index}:${column}`);
    return {
      kind,
      season: this.draft.season,
      file: seasonFileName(this.draft.season),
      sheet: COUNTS_SHEET,
      row: FIRST_DATA_ROW + index,
      column: columnLetter(column),
      header: this.draft.header[column - 1],
      found: cellText(found),
      shouldBe: cleanValue === null ? '' : String(cleanValue),
      cleanValue,
      note,
    };
  }

  /** A random free cell (row index, 1-based column) among the given columns whose clean visit passes the test. */
  private chooseCell(columns: readonly number[], ok: (index: number, column: number) => boolean): [number, number] {
    const candidates: [number, number][] = [];
    this.draft.rows.forEach((_, i) => {
      if (this.reservedRows.has(i)) return;
      for (const c of columns) if (!this.used.has(`${i}:${c}`) && ok(i, c)) candidates.push([i, c]);
    });
    if (candidates.length === 0) throw new Error(`No cell in the ${this.draft.season} Counts sheet is left to plant this problem in.`);
    return pick(this.rng, candidates);
  }

  private countAt(index: number, column: number): number {
    return this.draft.visitOf[index].counts[column - COLUMN.firstSpecies];
  }

  private set(index: number, column: number, value: SheetCell): void {
    this.draft.rows[index][column - 1] = value;
  }

  private duplicateRow(): PlantedProblem {
    const [i] = this.chooseCell([COLUMN.pond], () => true);
    this.draft.rows.splice(i + 1, 0, [...this.draft.rows[i]]);
    this.draft.visitOf.splice(i + 1, 0, this.draft.visitOf[i]);
    // Both copies stay clear of other problems, so the pair remains an exact repeat.
    this.reservedRows.add(i);
    this.reservedRows.add(i + 1);
    const pond = this.draft.visitOf[i].pond;
    return this.record('duplicated-row', i + 1, COLUMN.pond, pond, null, `Row ${FIRST_DATA_ROW + i + 1} repeats row ${FIRST_DATA_ROW + i} (same pond, date and visit): delete one of them.`);
  }

  private replaceCount(kind: MessKind, ok: (count: number) => boolean, written: (count: number) => string, note: (count: number) => string): PlantedProblem {
    const [i, c] = this.chooseCell(this.speciesColumns, (i, c) => ok(this.countAt(i, c)));
    const count = this.countAt(i, c);
    const value = written(count);
    this.set(i, c, value);
    return this.record(kind, i, c, value, count, note(count));
  }

  private atLeast(): PlantedProblem {
    // A tallier gives up counting a loud chorus and writes ">50"; with no count above 50, the season's largest count is written as more than one less.
    const free = (i: number, c: number) => !this.used.has(`${i}:${c}`);
    const loud: [number, number][] = [];
    let best: [number, number] | null = null;
    for (let i = 0; i < this.draft.rows.length; i++) {
      if (this.reservedRows.has(i)) continue;
      for (const c of this.speciesColumns) {
        if (!free(i, c)) continue;
        if (this.countAt(i, c) > AT_LEAST_LIMIT) loud.push([i, c]);
        if (best === null || this.countAt(i, c) > this.countAt(best[0], best[1])) best = [i, c];
      }
    }
    const chosen = loud.length > 0 ? pick(this.rng, loud) : best;
    if (chosen === null || this.countAt(chosen[0], chosen[1]) < 2) throw new Error(`The ${this.draft.season} Counts sheet has no count of 2 or more to write as a ">N" code.`);
    const [i, c] = chosen;
    const count = this.countAt(i, c);
    const floor = loud.length > 0 ? AT_LEAST_LIMIT : count - 1;
    const value = `>${floor}`;
    this.set(i, c, value);
    return this.record('at-least-code', i, c, value, count, `">${floor}" means more than ${floor} were heard: keep it as a lower bound or as missing (the simulated count was ${count}).`);
  }

  private blankMinutes(): PlantedProblem {
    const [i, c] = this.chooseCell([COLUMN.minutes], () => true);
    const minutes = this.draft.visitOf[i].minutes;
    this.set(i, c, null);
    return this.record('missing-minutes', i, c, null, minutes, `The listening minutes are missing: the effort offset cannot be used for this visit until they are filled in (the simulated value was ${minutes}).`);
  }

  private dateAsText(): PlantedProblem {
    const [i, c] = this.chooseCell([COLUMN.date], () => true);
    const iso = this.draft.visitOf[i].date;
    const value = dayFirstText(iso);
    this.set(i, c, value);
    return this.record('date-as-text', i, c, value, iso, `The date was typed as text (day/month/year): read it as ${iso}.`);
  }

  private pondVariant(style: 'case-and-space' | 'typo'): PlantedProblem {
    const ok = (i: number) => style === 'case-and-space' || /(\w)\1/.test(this.draft.visitOf[i].pond);
    const [i, c] = this.chooseCell([COLUMN.pond], ok);
    const name = this.draft.visitOf[i].pond;
    const value = style === 'typo' ? name.replace(/(\w)\1/, '$1') : caseAndSpaceVariant(name);
    this.set(i, c, value);
    return this.record('pond-name-variant', i, c, value, name, `The pond name "${value}" is a variant of "${name}": merge the two spellings.`);
  }
}

/** "Bittern Reach Pool" -> "Bittern Reach pool " (last word in lower case, a trailing space). */
function caseAndSpaceVariant(name: string): string {
  const words = name.split(' ');
  words[words.length - 1] = words[words.length - 1].toLowerCase();
  return `${words.join(' ')} `;
}
