// The rows a fit is given live in src-shared, where the report run uses them too.
export { fitTableFor, rowsOfSpecies, rowsWithOffsets } from '@shared/data/fit-rows';
