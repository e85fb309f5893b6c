import { app, BrowserWindow, dialog } from 'electron';
import { createHostServices } from '../services/host-services';
import { commandChannel, progressChannel, type HostCommand } from '@shared/host/channels';
import { registerHostHandlers } from './ipc';
import { installMenu } from './menu';
import { createMainWindow, openWithSystem, revealInFileManager } from './window';

// The Electron shell: windows, dialogs, menu and IPC wiring only. Everything
// it calls is a plain service that the tests run in Node.

app.enableSandbox();

function filters(extensions: string[]) {
  return [{ name: extensions.join(', '), extensions: extensions.map((e) => e.replace(/^\./, '')) }];
}

void app.whenReady().then(() => {
  let win: BrowserWindow | null = null;
  const services = createHostServices({
    appName: 'Tallywise',
    appVersion: app.getVersion(),
    platform: process.platform,
    userDataDir: app.getPath('userData'),
    dialogs: {
      async chooseOpen(title, extensions) {
        const r = await dialog.showOpenDialog({ title, properties: ['openFile'], filters: filters(extensions) });
        return r.canceled ? null : (r.filePaths[0] ?? null);
      },
      async chooseSave(title, defaultName, extensions) {
        const r = await dialog.showSaveDialog({ title, defaultPath: defaultName, filters: filters(extensions) });
        return r.canceled ? null : (r.filePath ?? null);
      },
      async chooseFolder(title) {
        const r = await dialog.showOpenDialog({ title, properties: ['openDirectory', 'createDirectory'] });
        return r.canceled ? null : (r.filePaths[0] ?? null);
      },
    },
    shell: { reveal: revealInFileManager, open: openWithSystem },
    progress: (event) => {
      if (win && !win.isDestroyed()) win.webContents.send(progressChannel, event);
    },
  });
  registerHostHandlers(services);
  win = createMainWindow();
  const send = (command: HostCommand) => win?.webContents.send(commandChannel, command);
  installMenu(win, send);
});

app.on('web-contents-created', (_e, contents) => {
  contents.on('will-attach-webview', (event) => event.preventDefault());
});

app.on('window-all-closed', () => {
  if (process.platform !== 'darwin') app.quit();
});
