/**
 * The renderer's fit worker (a module worker that electron-vite bundles from
 * `new Worker(new URL('./fit.worker.ts', import.meta.url), { type: 'module' })`
 * in ./fit-client.ts): serves the fit methods to the page. See docs/workers.md.
 */
import { fitMethods } from '@shared/worker/fit-methods';
import { serveMethods } from '@shared/worker/serve';
import { workerScopePort, type MessageEventSource } from './web-worker';

serveMethods(workerScopePort(self as unknown as MessageEventSource), fitMethods);
