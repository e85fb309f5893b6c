import { describe, expect, it } from 'vitest';
import { CellKind, GridBuilder } from '@shared/import/cells';
import { tableFromGrids } from '@shared/import/table-from-grids';
import { applyMapping } from '@shared/import/mapping';
import { guessTemplate } from '@shared/import/mapping-guess';
import { rolesToTemplate, templateToRoles } from '@shared/import/roles-template';
import type { ColumnRoles, LoadedSource } from '@shared/host/contract';
import { cleanedAnalysisOf } from '@shared/analysis/cleaned-analysis';
import { rawRecordsOf } from '@shared/analysis/loaded-records';
import { findColumn, selectRows } from '@shared/data/table';
import { appendEdit, emptyLog } from '@shared/cleaning/edit-log';
import { covariateField } from '@shared/import/visit-covariates';
import { tableRoles } from '@shared/model/table-roles';
import { parseModelSpec } from '@shared/model/spec';
import { checkSpec } from '@shared/model/spec-checks';
import { blankPredictorNotes } from '@shared/model/blank-predictors';
import { modelFrame, frameOptions } from '@shared/engine/frame';
import { recordsToColumns } from '../../src-main/services/record-wire';
import { predictorColumns } from '../../src-renderer/src/views/models/spec-draft';

// Visit covariates from the counts sheet, import -> records -> analysis
// table -> predictor choices and the notes on blank cells. Invented
// records of two ponds over two seasons; every expected value is worked out
// by hand in the comment beside it (the aggregation rule is the project's
// own, stated in visit-covariate-rule.ts).

type Cell = string | number | null;
const header = ['Pond', 'Date', 'Minutes', 'Water temp (°C)', 'Wind', 'Newt', 'Toad'];
const rows: Cell[][] = [
  ['Ash', '10/04/2023', 30, '12,5', 'calm', 3, 1],
  ['Ash', '10/06/2023', 30, 15, 'calm', 5, 0],
  ['Ash', '12/04/2024', 30, null, 'breezy', 2, 2],
  ['Ash', '12/06/2024', 30, 17, 'calm', 4, 1],
  ['Beck', '11/04/2023', 30, 10, 'calm', 1, 0],
  ['Beck', '11/06/2023', 30, 14, 'calm', 'NS', 0],
  ['Beck', '13/04/2024', 30, null, 'windy', 0, 3],
  ['Beck', '13/06/2024', 30, null, 'windy', 2, 1],
];

/** The sheet as a table read from a file whose decimal mark is a comma (as a CSV written with one would be). */
function sheet() {
  const g = new GridBuilder();
  [header, ...rows].forEach((r, i) =>
    r.forEach((v, j) => {
      if (v === null) return;
      if (typeof v === 'number') g.set(i + 1, j + 1, CellKind.number, String(v), v);
      else g.set(i + 1, j + 1, CellKind.text, v, Number.NaN);
    }),
  );
  return tableFromGrids([g.finish('ponds.csv', 'ponds.csv', false)], { kind: 'csv', decimalMark: ',' }, { dateOrder: 'dmy' });
}

const roles: ColumnRoles = { site: 'Pond', date: 'Date', effort: 'Minutes', effortUnit: 'minutes', speciesColumns: ['Newt', 'Toad'], covariates: ['Water temp (°C)', 'Wind'] };

function loaded(): LoadedSource {
  const table = sheet();
  const { records } = applyMapping(table, rolesToTemplate(roles, header, 'dmy'), { dateOrder: 'dmy' });
  return {
    summary: { id: 'src1', fileName: 'ponds.csv', sheet: 'ponds.csv', size: 1, sha256: 'x', importedAt: '2026-01-01T00:00:00.000Z', records: records.length, effortUnit: 'minutes', mappedBy: 'roles', notes: [] },
    records: recordsToColumns(records, 'src1'),
    findings: [],
  };
}

describe('visit covariates', () => {
  it('are found by the guess and kept as column roles', () => {
    const guessed = templateToRoles(guessTemplate(sheet()));
    expect('roles' in guessed && guessed.roles.covariates).toEqual(['Water temp (°C)', 'Wind']);
  });

  it('are read as numbers when the whole column is (decimal comma as the sheet writes it), else as texts', () => {
    const { records } = applyMapping(sheet(), rolesToTemplate(roles, header, 'dmy'), { dateOrder: 'dmy' });
    // One record per species on each row: the first row's two records carry 12,5 read as 12.5.
    expect(records.filter((r) => r.species === 'Newt').map((r) => r.visitCovariates!['Water temp (°C)'])).toEqual([12.5, 15, null, 17, 10, 14, null, null]);
    expect(records[0].visitCovariates!.Wind).toBe('calm');
  });

  it('travel with the records as fields of their own', () => {
    const src = loaded();
    expect(src.records.covariates).toEqual(['Water temp (°C)', 'Wind']);
    const raw = rawRecordsOf([src]);
    expect(raw).toHaveLength(16);
    expect(raw[0].fields[covariateField('Water temp (°C)')]).toBe(12.5);
    expect(raw[4].fields[covariateField('Wind')]).toBe('breezy');
    expect(raw[4].fields[covariateField('Water temp (°C)')]).toBeNull();
  });

  it('become one analysis column each: numbers by the mean over the row\'s visits, texts only where the visits agree', () => {
    const a = cleanedAnalysisOf([loaded()], emptyLog(), null).analysis;
    expect(a.visitCovariates).toEqual([
      { name: 'Water temp (°C)', column: 'water_temp_c', kind: 'number', disagreeing: 0 },
      // Ash 2024 (both species) and none else: "breezy" then "calm".
      { name: 'Wind', column: 'wind', kind: 'text', disagreeing: 2 },
    ]);
    const t = a.table;
    const at = (site: string, season: string, species: string) => {
      const s = findColumn(t, 'site')!.texts;
      const y = findColumn(t, 'season')!.texts;
      const sp = findColumn(t, 'species')!.texts;
      const k = s.findIndex((_, i) => s[i] === site && y[i] === season && sp[i] === species);
      return { temp: findColumn(t, 'water_temp_c')!.values[k], tempText: findColumn(t, 'water_temp_c')!.texts[k], wind: findColumn(t, 'wind')!.texts[k] };
    };
    // Ash 2023: (12.5 + 15) / 2 = 13.75; calm on both visits.
    expect(at('Ash', '2023', 'Newt')).toEqual({ temp: 13.75, tempText: '13.75', wind: 'calm' });
    // Ash 2024: one visit has no temperature, so the mean is of the other alone: 17. Wind breezy / calm: left blank.
    expect(at('Ash', '2024', 'Toad')).toEqual({ temp: 17, tempText: '17', wind: '' });
    // Beck 2023: the newt was not surveyed on the second visit, so the newt row has the first visit only (10);
    // the toad row has both: (10 + 14) / 2 = 12.
    expect(at('Beck', '2023', 'Newt').temp).toBe(10);
    expect(at('Beck', '2023', 'Toad').temp).toBe(12);
    // Beck 2024: no temperature on either visit: blank. Windy on both: kept.
    expect(at('Beck', '2024', 'Newt')).toEqual({ temp: Number.NaN, tempText: '', wind: 'windy' });
  });

  it('take the cleaning log\'s edits', () => {
    const src = loaded();
    const raw = rawRecordsOf([src]);
    // The Ash 2024 April visit gets a temperature of 13 on its newt record: the Ash 2024 newt mean becomes (13 + 17) / 2 = 15.
    const log = appendEdit(emptyLog(), { kind: 'set-value', recordId: raw[4].id, field: covariateField('Water temp (°C)'), old: null, new: 13 });
    const t = cleanedAnalysisOf([src], log, null).analysis.table;
    const k = findColumn(t, 'site')!.texts.findIndex((s, i) => s === 'Ash' && findColumn(t, 'season')!.texts[i] === '2024' && findColumn(t, 'species')!.texts[i] === 'Newt');
    expect(findColumn(t, 'water_temp_c')!.values[k]).toBe(15);
  });

  it('are offered as predictors, and the builder says how many rows a blank one drops', () => {
    const a = cleanedAnalysisOf([loaded()], emptyLog(), null).analysis;
    const r = tableRoles(a.table, a.effortColumn);
    const offered = predictorColumns(a.table, r);
    expect(offered.find((c) => c.name === 'water_temp_c')).toMatchObject({ numeric: true });
    expect(offered.find((c) => c.name === 'wind')).toMatchObject({ numeric: false, levels: ['calm', 'windy'] });
    const spec = parseModelSpec({ response: 'count', distribution: 'poisson', predictors: [{ column: 'water_temp_c', type: 'numeric' }, { column: 'wind', type: 'factor' }], offsets: [{ column: 'effort_h', log: true }] });
    const sp = findColumn(a.table, 'species')!.texts;
    const newt = { species: 'Newt', table: selectRows(a.table, sp.flatMap((s, i) => (s === 'Newt' ? [i] : []))) };
    // Newt rows: Ash 2023, Ash 2024, Beck 2023, Beck 2024. Temperature blank in Beck 2024; wind blank in Ash 2024.
    expect(checkSpec(spec, [newt], r)).toEqual([]);
    const notes = blankPredictorNotes(spec, [newt], r);
    expect(notes).toEqual([
      '"water_temp_c" is blank in 1 of the 4 Newt rows (Beck, 2024), so the fit leaves that row out. Fill in the visits\' values in Records to keep it, or leave "water_temp_c" out of the model.',
      '"wind" is blank in 1 of the 4 Newt rows (Ash, 2024), so the fit leaves that row out. Fill in the visits\' values in Records to keep it, or leave "wind" out of the model.',
      'In all, 2 rows of the 4 Newt rows are left out for a blank predictor; the fit uses 2 rows.',
    ]);
    // The engine's model frame leaves out the same two rows the notes count.
    const frame = modelFrame(newt.table, frameOptions(spec));
    expect(frame.rows).toHaveLength(2);
    expect(frame.warnings.map((w) => w.code)).toEqual(['dropped-rows']);
  });
});
