/** The renderer's export worker: builds the cleaned-data export tables off the UI thread. */
import { serveMethods } from '@shared/worker/serve';
import { exportMethods } from './export-methods';
import { workerScopePort, type MessageEventSource } from './web-worker';

serveMethods(workerScopePort(self as unknown as MessageEventSource), exportMethods);
