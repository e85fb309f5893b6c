/** A packed column from the bridge back to one value per record (see the contract); the code lives in src-shared. */
export { unpackColumn } from '@shared/analysis/loaded-records';
