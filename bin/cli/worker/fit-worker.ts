/**
 * Entry of the command line's fit worker thread (built to
 * out/cli/fit-worker.mjs beside the command-line bundle): serves the fit
 * methods, whole composite bootstrap replicates and report group steps over
 * the parent port.
 * See docs/workers.md.
 */
import { parentPort } from 'node:worker_threads';
import { reportFitMethods } from '@shared/report/fit-worker-methods';
import { serveMethods } from '@shared/worker/serve';
import { parentPortAsPort } from './node-worker';

if (!parentPort) throw new Error('fit-worker.mjs runs as a worker thread of the tallywise command line, not on its own.');
serveMethods(parentPortAsPort(parentPort), reportFitMethods);
