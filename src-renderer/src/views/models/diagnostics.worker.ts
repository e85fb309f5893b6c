/** The Models stage's diagnostics worker: computes the chart options off the UI thread. */
import { serveMethods } from '@shared/worker/serve';
import { workerScopePort, type MessageEventSource } from '../../worker/web-worker';
import { diagnosticsMethods } from './diagnostics-methods';

serveMethods(workerScopePort(self as unknown as MessageEventSource), diagnosticsMethods);
