import type { JobProgress } from '@shared/host/contract';

/**
 * What the services need from the desktop shell. Electron supplies real
 * dialogs and a file manager; the browser tests and the command line supply
 * their own. Keeping these behind small ports is what lets every service run
 * in plain Node.
 */
export interface DialogPort {
  chooseOpen(title: string, extensions: string[]): Promise<string | null>;
  chooseSave(title: string, defaultName: string, extensions: string[]): Promise<string | null>;
  /** A folder to write into (absent where the host cannot ask). */
  chooseFolder?(title: string): Promise<string | null>;
}

export interface ShellPort {
  reveal(path: string): Promise<boolean>;
  /** Opens a file with the system's program for it (absent where the host has none). */
  open?(path: string): Promise<boolean>;
}

export interface HostEnvironment {
  appName: string;
  appVersion: string;
  platform: string;
  /** Folder for recent-projects lists, recovery files and settings. */
  userDataDir: string;
  dialogs: DialogPort;
  shell: ShellPort;
  /** Sends a long job's progress to the page (absent where nobody listens). */
  progress?: (event: JobProgress) => void;
}
