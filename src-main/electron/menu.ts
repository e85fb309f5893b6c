import { Menu, type BrowserWindow, type MenuItemConstructorOptions } from 'electron';
import type { HostCommand } from '@shared/host/contract';

/** The application menu: the usual desktop accelerators, each sending a command to the page. */
export function installMenu(win: BrowserWindow, send: (command: HostCommand) => void): void {
  const isMac = process.platform === 'darwin';
  const file: MenuItemConstructorOptions = {
    label: '&File',
    submenu: [
      { label: 'Open project…', accelerator: 'CmdOrCtrl+O', click: () => send('open-project') },
      { label: 'Import workbook…', accelerator: 'CmdOrCtrl+I', click: () => send('import-workbook') },
      { label: 'Open demo programme', click: () => send('open-demo') },
      { type: 'separator' },
      { label: 'Save project', accelerator: 'CmdOrCtrl+S', click: () => send('save-project') },
      { label: 'Save project as…', accelerator: 'CmdOrCtrl+Shift+S', click: () => send('save-project-as') },
      { type: 'separator' },
      isMac ? { role: 'close' } : { role: 'quit', accelerator: 'Ctrl+Q' },
    ],
  };
  // Undo and redo step through the cleaning log; the page falls back to a
  // text field's own undo when one has the focus.
  const edit: MenuItemConstructorOptions = {
    label: '&Edit',
    submenu: [
      { label: 'Undo change', accelerator: 'CmdOrCtrl+Z', click: () => send('undo-change') },
      { label: 'Redo change', accelerator: isMac ? 'Shift+CmdOrCtrl+Z' : 'CmdOrCtrl+Y', click: () => send('redo-change') },
      { type: 'separator' },
      { role: 'cut' },
      { role: 'copy' },
      { role: 'paste' },
      { role: 'selectAll' },
    ],
  };
  const template: MenuItemConstructorOptions[] = [
    ...(isMac ? [{ role: 'appMenu' } as MenuItemConstructorOptions] : []),
    file,
    edit,
    { role: 'viewMenu' },
    { role: 'windowMenu' },
  ];
  Menu.setApplicationMenu(Menu.buildFromTemplate(template));
  void win;
}
