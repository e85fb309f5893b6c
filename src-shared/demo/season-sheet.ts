import { PROGRAMME_NAME, PROGRAMME_SLUG, type DemoPond } from './programme';
import type { DemoSimulation, SimulatedVisit } from './simulate';
import type { SheetCell, SheetGrid, WorkbookGrid } from './sheet-grid';

/**
 * The layout of one season's tally workbook (documented in
 * resources/demo/README.md; a test keeps the two in step):
 *
 * Sheet "Counts" (wide: one row per pond visit, one column per species)
 *   row 1  title: programme name and season
 *   row 2  how to read the counts and the field codes
 *   row 3  who compiled the sheet
 *   row 4  blank
 *   row 5  column headers
 *   row 6… one row per pond visit (pond order, then visit number)
 *   then one blank row and one closing note line.
 * Sheet "Ponds": header row 1 (Pond, Area (m²), Habitat), one row per pond.
 */
export const COUNTS_SHEET = 'Counts';
export const PONDS_SHEET = 'Ponds';
export const COUNTS_HEADER_ROW = 5;
export const FIRST_DATA_ROW = COUNTS_HEADER_ROW + 1;
export const VISIT_COLUMNS = ['Pond', 'Date', 'Visit', 'Observer', 'Minutes', 'Water temp (°C)'] as const;
export const REMARKS_HEADER = 'Remarks';
export const PONDS_COLUMNS = ['Pond', 'Area (m²)', 'Habitat'] as const;

/** 1-based column numbers of the fixed visit columns. */
export const COLUMN = { pond: 1, date: 2, visit: 3, observer: 4, minutes: 5, waterTemp: 6, firstSpecies: 7 } as const;

export function seasonFileName(season: number): string {
  return `${PROGRAMME_SLUG}-${season}.xlsx`;
}

export function countsHeader(sim: DemoSimulation): string[] {
  return [...VISIT_COLUMNS, ...sim.truth.species.map((s) => s.label), REMARKS_HEADER];
}

/** The parts of the Counts sheet that the mess planter may change. */
export interface CountsDraft {
  readonly season: number;
  readonly header: readonly string[];
  /** Data rows; row i is written at Excel row FIRST_DATA_ROW + i. */
  readonly rows: SheetCell[][];
  /** Which simulated visit each data row shows (a duplicated row repeats one). */
  readonly visitOf: SimulatedVisit[];
}

export function countsDraft(sim: DemoSimulation, season: number): CountsDraft {
  const visits = sim.visits.filter((v) => v.season === season);
  const rows = visits.map((v): SheetCell[] => [v.pond, { date: v.date }, v.visit, v.observer, v.minutes, v.waterTempC, ...v.counts, v.remark === '' ? null : v.remark]);
  return { season, header: countsHeader(sim), rows, visitOf: [...visits] };
}

export function titleLines(season: number): string[] {
  return [
    `${PROGRAMME_NAME} — ${season} season tally`,
    'Counts are calling adults heard during the listening period. Field codes: NS = not surveyed, x = present but not counted, >N = more than N heard.',
    `Compiled from volunteer field cards by the survey coordinator, ${season}.`,
  ];
}

export function closingNote(season: number, visits: number): string {
  return `End of ${season} records (${visits} pond visits). Please do not add rows below this line.`;
}

export function countsSheet(draft: CountsDraft): SheetGrid {
  const blank: SheetCell[] = [];
  const rows: SheetCell[][] = [
    ...titleLines(draft.season).map((t): SheetCell[] => [t]),
    blank,
    [...draft.header],
    ...draft.rows,
    blank,
    [closingNote(draft.season, draft.rows.length)],
  ];
  const widths = draft.header.map((h, c) => (c === 0 ? 24 : Math.max(9, h.length + 2)));
  return { name: COUNTS_SHEET, rows, headerRow: COUNTS_HEADER_ROW, widths };
}

export function pondsSheet(ponds: readonly DemoPond[]): SheetGrid {
  const rows: SheetCell[][] = [[...PONDS_COLUMNS], ...ponds.map((p): SheetCell[] => [p.name, p.areaM2, p.habitat])];
  return { name: PONDS_SHEET, rows, headerRow: 1, widths: [24, 11, 10] };
}

export function seasonWorkbook(sim: DemoSimulation, draft: CountsDraft): WorkbookGrid {
  return { fileName: seasonFileName(draft.season), season: draft.season, sheets: [countsSheet(draft), pondsSheet(sim.ponds)] };
}
