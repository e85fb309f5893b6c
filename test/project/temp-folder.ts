import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** A fresh folder under the system temp folder; remove it with the returned function. */
export function tempFolder(prefix = 'tw-project-'): { dir: string; remove: () => void } {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return { dir, remove: () => rmSync(dir, { recursive: true, force: true }) };
}

/** Every entry of a folder with its bytes (`<folder>` for a sub-folder), to compare before and after. */
export function snapshot(dir: string): Record<string, string> {
  return Object.fromEntries(
    readdirSync(dir)
      .sort()
      .map((n) => {
        const p = join(dir, n);
        return [n, statSync(p).isDirectory() ? '<folder>' : readFileSync(p).toString('base64')];
      }),
  );
}
