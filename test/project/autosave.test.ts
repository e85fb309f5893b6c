import { utimesSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { checkRecovery, createAutosaver, discardRecovery } from '../../src-main/project/autosave';
import { saveProject } from '../../src-main/project/project-store';
import { recoveryPathFor, untitledRecoveryPath } from '../../src-main/project/project-paths';
import type { ProjectDocument } from '@shared/project/document';
import { sampleProject } from './sample-project';
import { snapshot, tempFolder } from './temp-folder';

const doc = (name: string): ProjectDocument => sampleProject({ name, cells: 16 });

describe('createAutosaver timing (fake timers)', () => {
  beforeEach(() => {
    vi.useFakeTimers();
    vi.setSystemTime(new Date('2026-03-01T09:00:00Z'));
  });
  afterEach(() => vi.useRealTimers());

  function recorder() {
    const writes: { at: number; name: string }[] = [];
    const start = Date.now();
    const write = async (d: ProjectDocument) => {
      writes.push({ at: Date.now() - start, name: d.programme.name });
    };
    return { writes, write };
  }

  it('writes once, a quiet moment after a single change', async () => {
    const { writes, write } = recorder();
    const saver = createAutosaver({ recoveryPath: 'r', write, quietMs: 2000 });
    saver.changed(doc('one'));
    expect(saver.pending).toBe(true);
    await vi.advanceTimersByTimeAsync(1999);
    expect(writes).toEqual([]);
    await vi.advanceTimersByTimeAsync(1);
    expect(writes).toEqual([{ at: 2000, name: 'one' }]);
    expect(saver.pending).toBe(false);
    await vi.advanceTimersByTimeAsync(60_000);
    expect(writes).toHaveLength(1);
  });

  it('continuous editing still saves, at most 30 s after the first unsaved change, and writes the latest', async () => {
    const { writes, write } = recorder();
    const saver = createAutosaver({ recoveryPath: 'r', write });
    for (let t = 0; t < 70_000; t += 1000) {
      saver.changed(doc(`edit at ${t}`));
      await vi.advanceTimersByTimeAsync(1000);
    }
    expect(writes.map((w) => w.at)).toEqual([30_000, 60_000]);
    expect(writes[0].name).toBe('edit at 29000');
    saver.dispose();
  });

  it('flush writes a waiting change at once; dispose drops it', async () => {
    const { writes, write } = recorder();
    const saver = createAutosaver({ recoveryPath: 'r', write, delayMs: 10_000 });
    saver.changed(doc('a'));
    await saver.flush();
    expect(writes).toEqual([{ at: 0, name: 'a' }]);
    saver.changed(doc('b'));
    saver.dispose();
    await vi.advanceTimersByTimeAsync(20_000);
    expect(writes).toHaveLength(1);
    saver.changed(doc('c'));
    expect(saver.pending).toBe(false);
  });

  it('a failed write is reported and tried again', async () => {
    let fail = true;
    const names: string[] = [];
    const errors: unknown[] = [];
    const saver = createAutosaver({
      recoveryPath: 'r',
      quietMs: 1000,
      write: async (d) => {
        if (fail) throw new Error('disk full');
        names.push(d.programme.name);
      },
      onError: (e) => errors.push(e),
    });
    saver.changed(doc('x'));
    await vi.advanceTimersByTimeAsync(1000);
    expect(errors).toHaveLength(1);
    expect(saver.pending).toBe(true);
    fail = false;
    await vi.advanceTimersByTimeAsync(1000);
    expect(names).toEqual(['x']);
    saver.dispose();
  });
});

describe('recovery files on disk', () => {
  let folder: ReturnType<typeof tempFolder>;
  beforeEach(() => (folder = tempFolder()));
  afterEach(() => folder.remove());

  it('the autosaver writes a loadable recovery file; checkRecovery offers it only when newer than the project', async () => {
    const project = join(folder.dir, 'p.tallywise');
    const recovery = recoveryPathFor(project);
    await saveProject(project, doc('saved'));
    expect(await checkRecovery(project)).toBeNull();

    const saver = createAutosaver({ recoveryPath: recovery });
    saver.changed(doc('unsaved work'));
    await saver.flush();
    utimesSync(project, new Date('2026-01-01T00:00:00Z'), new Date('2026-01-01T00:00:00Z'));
    const offer = await checkRecovery(project);
    expect(offer?.document?.programme.name).toBe('unsaved work');
    expect(offer?.recoveryPath).toBe(recovery);

    utimesSync(recovery, new Date('2025-12-31T00:00:00Z'), new Date('2025-12-31T00:00:00Z'));
    expect(await checkRecovery(project)).toBeNull(); // older than the project: nothing to offer

    await discardRecovery(recovery);
    expect(Object.keys(snapshot(folder.dir))).toEqual(['p.tallywise']);
    await expect(discardRecovery(recovery)).resolves.toBeUndefined();
  });

  it('offers the recovery of a project never saved, and explains a damaged recovery file', async () => {
    const recovery = untitledRecoveryPath(join(folder.dir, 'user-data'));
    expect(await checkRecovery(null, recovery)).toBeNull();
    const saver = createAutosaver({ recoveryPath: recovery });
    saver.changed(doc('untitled work'));
    await saver.flush(); // creates the user-data recovery folder
    expect((await checkRecovery(null, recovery))?.document?.programme.name).toBe('untitled work');

    const gone = join(folder.dir, 'deleted.tallywise');
    writeFileSync(recoveryPathFor(gone), 'garbage');
    const offer = await checkRecovery(gone);
    expect(offer?.document).toBeNull();
    expect(offer?.problem).toMatch(/not a Tallywise project file/);
  });
});
