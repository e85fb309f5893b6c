import { spawn } from 'node:child_process';
import { existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { encodeProject, loadProject, saveProject } from '../../src-main/project/project-store';
import { backupPathFor } from '../../src-main/project/project-paths';
import { createRng } from '@shared/demo/prng';
import { sampleProject } from './sample-project';
import { tempFolder } from './temp-folder';

// Crash safety (DESIGN.md, "Saving: write a temporary file, flush, rename;
// keep the previous version"). A plain `node` child runs the disk-writing
// module of saveProject (replace-file.mjs has no dependencies, so no
// TypeScript loader is needed) and saves two large versions in turn; it is
// killed with SIGKILL at seeded random moments. Each time the project file
// must be exactly one of the versions and load, and so must the backup.
// Common practice: rename over a file is atomic on POSIX file systems.

const rounds = 6;
let work: ReturnType<typeof tempFolder>;
let inputs: ReturnType<typeof tempFolder>;
let versions: Buffer[];

beforeAll(() => {
  work = tempFolder('tw-crash-');
  inputs = tempFolder('tw-crash-inputs-');
  versions = ['Version A', 'Version B'].map((name, i) => Buffer.from(encodeProject(sampleProject({ cells: 120_000, seed: i + 1, name }))));
  versions.forEach((v, i) => writeFileSync(join(inputs.dir, `v${i}.bin`), v));
});
afterAll(() => {
  work.remove();
  inputs.remove();
});

function runAndKill(file: string, afterMs: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [join(__dirname, 'save-loop.child.mjs'), file, backupPathFor(file), join(inputs.dir, 'v0.bin'), join(inputs.dir, 'v1.bin')], {
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let err = '';
    child.stderr.on('data', (d) => (err += d));
    child.stdout.once('data', () => setTimeout(() => child.kill('SIGKILL'), afterMs));
    child.on('error', reject);
    child.on('exit', (code, signal) => (signal === 'SIGKILL' ? resolve() : reject(new Error(`the saving child ended by itself (${code}): ${err}`))));
  });
}

function whichVersion(path: string): number {
  const bytes = readFileSync(path);
  return versions.findIndex((v) => v.equals(bytes));
}

describe('saving survives being killed at any moment', () => {
  it('the project file and its backup are always a whole, loadable version', async () => {
    const file = join(work.dir, 'big.tallywise');
    await saveProject(file, sampleProject({ name: 'Before the crash tests' }));
    const rng = createRng(4242);
    const seen = new Set<number>();
    for (let round = 0; round < rounds; round++) {
      await runAndKill(file, 5 + Math.floor(rng.uniform() * 250));
      const v = whichVersion(file);
      const name = (await loadProject(file)).document.programme.name;
      if (v >= 0) {
        seen.add(v);
        expect(name).toBe(['Version A', 'Version B'][v]);
      } else {
        // killed before its first save finished: the file is the one saved before
        expect(name).toBe('Before the crash tests');
      }
      expect(existsSync(backupPathFor(file))).toBe(true);
      await expect(loadProject(backupPathFor(file))).resolves.toBeDefined();
    }
    // leftover temporary files (from kills mid-write) are never the project file itself
    const names = readdirSync(work.dir).filter((n) => n !== 'big.tallywise' && n !== 'big.tallywise.bak');
    for (const n of names) expect(n).toMatch(/^\.big\.tallywise(\.bak)?\.\d+-[0-9a-f]{8}\.tmp$/);
    expect(seen.size).toBeGreaterThan(0);
  });
});
