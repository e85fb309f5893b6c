import { contextBridge, ipcRenderer, webUtils } from 'electron';
import { bridgeGlobal, channelNames, commandChannel, hostCommands, progressChannel, type HostCommand } from '@shared/host/channels';

// Exposes exactly one function per contract channel, plus listeners for
// host commands and jobs' progress, and the path of a dropped file. Nothing
// else of Electron or Node reaches the page.
const bridge: Record<string, unknown> = {};
for (const channel of channelNames) {
  bridge[channel] = (input: unknown) => ipcRenderer.invoke(channel, input);
}
bridge['onCommand'] = (listener: (command: HostCommand) => void) => {
  const handler = (_event: unknown, command: unknown) => {
    if ((hostCommands as readonly unknown[]).includes(command)) listener(command as HostCommand);
  };
  ipcRenderer.on(commandChannel, handler);
  return () => ipcRenderer.removeListener(commandChannel, handler);
};
// A long job's progress: only plain objects that name their job get through.
bridge['onProgress'] = (listener: (progress: unknown) => void) => {
  const handler = (_event: unknown, progress: unknown) => {
    if (progress && typeof progress === 'object' && typeof (progress as { jobId?: unknown }).jobId === 'string') listener(progress);
  };
  ipcRenderer.on(progressChannel, handler);
  return () => ipcRenderer.removeListener(progressChannel, handler);
};
// A dropped file's path on disk (the page sees only the File object).
bridge['pathForFile'] = (file: File) => webUtils.getPathForFile(file);
contextBridge.exposeInMainWorld(bridgeGlobal, Object.freeze(bridge));
