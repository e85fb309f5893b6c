/**
 * What a report's fit workers serve (the command line's worker threads and
 * the app's report worker's own workers): single fits, whole composite
 * bootstrap replicates and whole report group steps. A pool of such workers
 * is marked with servesReplicates so that poolRunner uses all three.
 */
import { replicateMethods } from '../trend/composite-replicate';
import { fitMethods } from '../worker/fit-methods';
import { groupStepMethods } from './group-step';

export const reportFitMethods = { ...fitMethods, ...replicateMethods, ...groupStepMethods };

export type ReportFitMethods = typeof reportFitMethods;
