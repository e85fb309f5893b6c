/**
 * The contract's channel names, commands and global name, with no schema
 * library attached: the sandboxed preload bundles this file alone (a
 * sandboxed preload can require nothing but Electron). contract.ts checks at
 * compile time that its map has exactly these channels.
 */
export const channelNames = [
  'app:info',
  'demo:overview',
  'dialog:choose-open',
  'dialog:choose-save',
  'dialog:choose-folder',
  'file:reveal',
  'file:open',
  'file:fingerprint',
  'import:list-sheets',
  'import:read-workbook',
  'import:cancel',
  'project:new-from-demo',
  'project:open',
  'project:save',
  'project:autosave',
  'project:check-recovery',
  'project:discard-recovery',
  'project:sheet-cells',
  'project:source-sheets',
  'report:write',
  'export:write',
] as const;
export type ChannelName = (typeof channelNames)[number];

/** Commands the host sends to the page (menu items, drag-and-drop). */
export const hostCommands = ['open-project', 'save-project', 'save-project-as', 'import-workbook', 'open-demo', 'undo-change', 'redo-change'] as const;
export type HostCommand = (typeof hostCommands)[number];

/** Name of the global the bridge is exposed as. */
export const bridgeGlobal = 'tallywiseHost';

/** The IPC channel that carries host commands to the page. */
export const commandChannel = 'host:command';

/** The IPC channel that carries a long job's progress (an import) to the page; each event names its job. */
export const progressChannel = 'host:progress';

/** The stable name of the error a cancelled import rejects with. */
export const importCancelledName = 'ImportCancelled';
