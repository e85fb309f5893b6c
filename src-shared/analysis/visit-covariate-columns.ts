import { fixedAnalysisColumns } from '../import/aggregate';
import { covariateName } from './site-attributes';

/**
 * The analysis-table column of each visit covariate: its header made plain
 * the way site covariates are ("Water temp (°C)" -> `water_temp_c`, see
 * covariateName). A name the table already uses (a fixed column such as
 * `count`, or a site covariate from the site list) gets `_visit` added, and
 * a repeat after that a number, so no column is ever written twice.
 */
export function visitCovariateColumns(names: readonly string[], siteCovariates: readonly string[] = []): { name: string; column: string }[] {
  const taken = new Set([...fixedAnalysisColumns, ...siteCovariates]);
  return names.map((name) => {
    const plain = covariateName(name);
    let column = taken.has(plain) ? `${plain}_visit` : plain;
    for (let k = 2; taken.has(column); k++) column = `${plain}_visit_${k}`;
    taken.add(column);
    return { name, column };
  });
}
