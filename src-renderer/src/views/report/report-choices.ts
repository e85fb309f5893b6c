import type { DataTable } from '@shared/data/table';
import { speciesChoices, type ChosenModel, type SpeciesChoice } from '@shared/report/programme-plan';
import type { FittedModel } from '../models/fitted-model';

/**
 * The Report stage's view of the Models stage: the model chosen for each
 * species, as the report plan takes it, and for every species of the table
 * whether it can be reported and, if not, why and where to fix it.
 */
export interface ReportChoices {
  readonly chosen: readonly ChosenModel[];
  /** Every model fitted to the current data (the others of a species go into its comparison). */
  readonly candidates: readonly ChosenModel[];
  readonly choices: readonly SpeciesChoice[];
}

export const OUT_OF_DATE = 'its chosen model was fitted before the cleaned records last changed';

const asChosen = (m: FittedModel): ChosenModel => ({ species: m.species, name: m.label, spec: m.spec, dropBadOffsetRows: m.dropBadOffsetRows });

export function reportChoices(table: DataTable, models: readonly FittedModel[], forReport: Readonly<Record<string, string>>, dataKey: string): ReportChoices {
  const stale = new Set<string>();
  const chosen: ChosenModel[] = [];
  for (const [species, id] of Object.entries(forReport)) {
    const m = models.find((x) => x.id === id);
    if (!m) continue;
    if (m.dataKey !== dataKey) stale.add(species);
    else chosen.push(asChosen(m));
  }
  const choices = speciesChoices(table, chosen).map((c) => (stale.has(c.species) ? { ...c, problem: OUT_OF_DATE } : c));
  const candidates = models.filter((m) => m.dataKey === dataKey).map(asChosen);
  return { chosen, candidates, choices };
}

/** Where the analyst fixes a species that cannot be reported. */
export function fixFor(problem: string): string {
  if (problem === OUT_OF_DATE) return 'Fit it again on the Models stage.';
  if (problem.includes('no time term')) return 'On the Models stage, fit a model with a season trend and choose it for the report.';
  return 'On the Models stage, fit a model and pick it in the "For the report" column.';
}
