/** The renderer's report worker: runs a programme's report (every species' trend and the composite) off the UI thread. */
import { serveMethods } from '@shared/worker/serve';
import { reportMethods } from './report-methods';
import { workerScopePort, type MessageEventSource } from './web-worker';

serveMethods(workerScopePort(self as unknown as MessageEventSource), reportMethods);
