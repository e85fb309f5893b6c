import { tableFromTexts, type DataTable } from '../data/table';
import { toCsvText } from './csv-text';
import type { DemoSimulation } from './simulate';
import type { Habitat } from './programme';

/**
 * The clean analysis table of the demo: one row per pond x season x species
 * for every pond visited that season, with the season's counts and listening
 * minutes summed over visits. This is the truth before any mess is planted
 * in the sheets; an analyst's cleaned import should come close to it.
 */
export interface AnalysisRow {
  readonly pond: string;
  readonly season: number;
  readonly species: string;
  readonly count: number;
  readonly minutes: number;
  readonly areaM2: number;
  readonly habitat: Habitat;
  /** Mean water temperature over the season's visits, to 2 decimals. */
  readonly meanTempC: number;
  readonly visits: number;
}

/** Column names of the clean table, in order (also the CSV header). */
export const ANALYSIS_COLUMNS = ['pond', 'season', 'species', 'count', 'minutes', 'area_m2', 'habitat', 'temp_c', 'visits'] as const;

export function analysisRows(sim: DemoSimulation): AnalysisRow[] {
  const groups = new Map<string, DemoSimulation['visits'][number][]>();
  for (const v of sim.visits) {
    const key = `${v.season}\u0000${v.pond}`;
    const g = groups.get(key);
    if (g) g.push(v);
    else groups.set(key, [v]);
  }
  const rows: AnalysisRow[] = [];
  for (const group of groups.values()) {
    const first = group[0];
    const minutes = group.reduce((s, v) => s + v.minutes, 0);
    const meanTempC = Math.round((group.reduce((s, v) => s + v.waterTempC, 0) / group.length) * 100) / 100;
    sim.truth.species.forEach((sp, j) => {
      rows.push({
        pond: first.pond,
        season: first.season,
        species: sp.key,
        count: group.reduce((s, v) => s + v.counts[j], 0),
        minutes,
        areaM2: first.areaM2,
        habitat: first.habitat,
        meanTempC,
        visits: group.length,
      });
    });
  }
  return rows;
}

function rowCells(r: AnalysisRow): (string | number)[] {
  return [r.pond, r.season, r.species, r.count, r.minutes, r.areaM2, r.habitat, r.meanTempC, r.visits];
}

export function analysisCsvText(rows: readonly AnalysisRow[]): string {
  return toCsvText(ANALYSIS_COLUMNS, rows.map(rowCells));
}

/** The same table as a DataTable, for tests and the engine. */
export function analysisDataTable(rows: readonly AnalysisRow[]): DataTable {
  return tableFromTexts(ANALYSIS_COLUMNS, rows.map((r) => rowCells(r).map(String)));
}
