import { bridgeGlobal } from '@shared/host/contract';

/**
 * The file-system path of a file dropped on the window. Pages cannot see
 * paths; in the desktop app preload is to add `pathForFile(file)` to the
 * bridge (Electron's webUtils.getPathForFile). Without it, null.
 */
export function pathOfDroppedFile(file: File): string | null {
  const bridge = (globalThis as unknown as Record<string, { pathForFile?: (f: File) => string } | undefined>)[bridgeGlobal];
  const path = bridge?.pathForFile?.(file);
  return typeof path === 'string' && path !== '' ? path : null;
}
