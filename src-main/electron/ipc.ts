import { ipcMain } from 'electron';
import { channels, type HostServices } from '@shared/host/contract';
import { dispatchHostCall } from '@shared/host/dispatch';

/** Registers one IPC handler per contract channel; each validates its argument before the service runs. */
export function registerHostHandlers(services: HostServices): void {
  for (const channel of channels) {
    ipcMain.handle(channel, (_event, input: unknown) => dispatchHostCall(services, channel, input));
  }
}
