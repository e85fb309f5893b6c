import { basename, join } from 'node:path';

/** File names that belong to a project file: its extension, backup and recovery files. */
export const PROJECT_EXTENSION = '.tallywise';

/** The previous version kept on each save: `<name>.tallywise.bak`. */
export function backupPathFor(projectPath: string): string {
  return `${projectPath}.bak`;
}

/** Where autosave writes unsaved work for a project: `<name>.tallywise.recovery`, beside it. */
export function recoveryPathFor(projectPath: string): string {
  return `${projectPath}.recovery`;
}

/** The project's name as shown to the user: the file name without the extension. */
export function projectDisplayName(projectPath: string): string {
  const name = basename(projectPath);
  return name.endsWith(PROJECT_EXTENSION) ? name.slice(0, -PROJECT_EXTENSION.length) : name;
}

/** Recovery file for a project not yet saved anywhere, kept in the app's user-data folder. */
export function untitledRecoveryPath(userDataDir: string): string {
  return join(userDataDir, 'recovery', `untitled${PROJECT_EXTENSION}.recovery`);
}
