import { join } from 'node:path';
import { app, BrowserWindow, dialog, shell } from 'electron';

/**
 * The one application window, locked down: the page runs sandboxed with
 * context isolation and no Node, may not navigate away or open windows, and
 * loads only the bundled files (its content security policy is in
 * index.html).
 */
export function createMainWindow(): BrowserWindow {
  const win = new BrowserWindow({
    width: 1366,
    height: 860,
    minWidth: 1024,
    minHeight: 640,
    show: false,
    title: 'Tallywise',
    backgroundColor: '#f6f4ef',
    webPreferences: {
      preload: join(__dirname, '../preload/index.cjs'),
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      webSecurity: true,
      allowRunningInsecureContent: false,
      spellcheck: false,
    },
  });
  win.once('ready-to-show', () => win.show());
  win.webContents.on('will-navigate', (event) => event.preventDefault());
  win.webContents.on('will-redirect', (event) => event.preventDefault());
  win.webContents.setWindowOpenHandler(() => ({ action: 'deny' }));
  // The page holds back closing while its project has unsaved changes: ask, and close only when told to.
  win.webContents.on('will-prevent-unload', (event) => {
    const choice = dialog.showMessageBoxSync(win, {
      type: 'question',
      buttons: ['Close without saving', 'Keep working'],
      defaultId: 1,
      cancelId: 1,
      title: 'Unsaved changes',
      message: 'The project has changes that are not saved.',
      detail: 'Close Tallywise and drop them? Keep working and save the project first to keep them.',
    });
    if (choice === 0) event.preventDefault();
  });
  win.webContents.session.setPermissionRequestHandler((_wc, _permission, callback) => callback(false));

  const devUrl = process.env['ELECTRON_RENDERER_URL'];
  if (devUrl && !app.isPackaged) void win.loadURL(devUrl);
  else void win.loadFile(join(__dirname, '../renderer/index.html'));
  return win;
}

/** Opens a folder or file in the system's file manager. */
export async function revealInFileManager(path: string): Promise<boolean> {
  shell.showItemInFolder(path);
  return true;
}

/** Opens a file with the program the system uses for its kind. */
export async function openWithSystem(path: string): Promise<boolean> {
  return (await shell.openPath(path)) === '';
}
