import { modelEquationTex, type ModelEquationTex } from '@shared/model/equation-tex';
import type { ModelSpec } from '@shared/model/spec';
import { offsetNames, type TableRoles } from '@shared/model/table-roles';
import type { PredictorColumn } from './spec-draft';

/**
 * The builder's model in ordinary notation (TeX from src-shared), with the
 * offsets named by their units and factors by their levels in this table.
 */
export function modelEquation(spec: ModelSpec, roles: TableRoles, columns: readonly PredictorColumn[] = []): ModelEquationTex {
  return modelEquationTex(spec, {
    offsets: offsetNames(roles),
    levels: Object.fromEntries(columns.map((c) => [c.name, c.levels])),
    numericColumns: columns.filter((c) => c.numeric).map((c) => c.name),
  });
}
