import type { HostServices } from '@shared/host/contract';
import type { HostEnvironment } from './ports';
import { demoOverview } from './demo-overview';

/** All host calls, as plain async functions over the environment's ports. */
export function createHostServices(env: HostEnvironment): HostServices {
  return {
    'app:info': async () => ({ name: env.appName, version: env.appVersion, platform: env.platform }),
    'demo:overview': async () => demoOverview(),
    'dialog:choose-open': async ({ title, extensions }) => ({ path: await env.dialogs.chooseOpen(title, extensions) }),
    'dialog:choose-save': async ({ title, defaultName, extensions }) => ({
      path: await env.dialogs.chooseSave(title, defaultName, extensions),
    }),
    'file:reveal': async ({ path }) => ({ ok: await env.shell.reveal(path) }),
  };
}
