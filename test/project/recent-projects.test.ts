import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { addRecentProject, listRecentProjects, MAX_RECENT, RECENT_FILE_NAME, removeRecentProject } from '../../src-main/project/recent-projects';
import { tempFolder } from './temp-folder';

let folder: ReturnType<typeof tempFolder>;
let userData: string;
beforeEach(() => {
  folder = tempFolder();
  userData = join(folder.dir, 'user-data');
});
afterEach(() => folder.remove());

function project(name: string): string {
  const p = join(folder.dir, `${name}.tallywise`);
  writeFileSync(p, 'x');
  return p;
}
const at = (minute: number) => new Date(Date.UTC(2026, 2, 1, 9, minute));

describe('recent projects', () => {
  it('starts empty, even without a user-data folder', async () => {
    expect(await listRecentProjects(userData)).toEqual([]);
  });

  it('lists the most recent first, moves a reopened project to the top, keeps ten', async () => {
    for (let i = 0; i < 12; i++) await addRecentProject(userData, project(`p${i}`), at(i));
    await addRecentProject(userData, join(folder.dir, 'p5.tallywise'), at(30));
    const list = await listRecentProjects(userData);
    expect(list).toHaveLength(MAX_RECENT);
    expect(list.map((p) => p.name)).toEqual(['p5', 'p11', 'p10', 'p9', 'p8', 'p7', 'p6', 'p4', 'p3', 'p2']);
    expect(list[0].openedAt).toBe('2026-03-01T09:30:00.000Z');
  });

  it('flags files that have gone missing and removes an entry on request', async () => {
    const a = project('a');
    const b = project('b');
    await addRecentProject(userData, a, at(1));
    await addRecentProject(userData, b, at(2));
    rmSync(a);
    expect((await listRecentProjects(userData)).map((p) => [p.name, p.missing])).toEqual([
      ['b', false],
      ['a', true],
    ]);
    expect((await removeRecentProject(userData, a)).map((p) => p.name)).toEqual(['b']);
  });

  it('a damaged list file counts as empty and is replaced by the next change', async () => {
    await addRecentProject(userData, project('a'), at(1));
    writeFileSync(join(userData, RECENT_FILE_NAME), '{ not json');
    expect(await listRecentProjects(userData)).toEqual([]);
    await addRecentProject(userData, project('b'), at(2));
    expect(JSON.parse(readFileSync(join(userData, RECENT_FILE_NAME), 'utf8')).projects).toHaveLength(1);
    expect(existsSync(join(userData, RECENT_FILE_NAME))).toBe(true);
  });
});
