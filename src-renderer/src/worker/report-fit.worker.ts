/**
 * A fit worker of the report worker (started from ./report-methods.ts, a
 * worker within the report worker): serves single fits, whole composite
 * bootstrap replicates and whole group steps, so that a report uses every
 * core. See docs/workers.md.
 */
import { reportFitMethods } from '@shared/report/fit-worker-methods';
import { serveMethods } from '@shared/worker/serve';
import { workerScopePort, type MessageEventSource } from './web-worker';

serveMethods(workerScopePort(self as unknown as MessageEventSource), reportFitMethods);
