import { analysisRows, type AnalysisRow } from './analysis-table';
import { plantMess, MESS_PLAN, type MessStep, type PlantedProblem } from './mess';
import { countsDraft, seasonWorkbook } from './season-sheet';
import type { WorkbookGrid } from './sheet-grid';
import { simulateDemo, type DemoSimulation } from './simulate';
import { DEFAULT_DEMO_SEED, seasonsOf } from './truth';

export interface DemoBuild {
  readonly seed: number;
  readonly simulation: DemoSimulation;
  /** One messy workbook per season, as plain data. */
  readonly workbooks: WorkbookGrid[];
  readonly planted: PlantedProblem[];
  /** The clean long analysis table (the truth before mess). */
  readonly clean: AnalysisRow[];
}

/** The whole demo from one seed: simulation, season workbooks with their planted problems, and the clean table. */
export function buildDemo(seed: number = DEFAULT_DEMO_SEED, plan: readonly MessStep[] = MESS_PLAN): DemoBuild {
  const simulation = simulateDemo(seed);
  const drafts = seasonsOf(simulation.truth).map((season) => countsDraft(simulation, season));
  const { drafts: messy, planted } = plantMess(drafts, seed, plan);
  return { seed, simulation, workbooks: messy.map((d) => seasonWorkbook(simulation, d)), planted, clean: analysisRows(simulation) };
}
