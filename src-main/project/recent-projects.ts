import { mkdir, readFile, stat } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { z } from 'zod';
import { projectDisplayName } from './project-paths';
import { replaceFile } from './replace-file.mjs';

/**
 * The recent-projects list: a small JSON file in the app's user-data folder,
 * most recent first, at most ten entries. Files that have gone missing stay
 * in the list, flagged, so the user can see and remove them.
 */
export const RECENT_FILE_NAME = 'recent-projects.json';
export const MAX_RECENT = 10;

const storedSchema = z.object({
  kind: z.literal('tallywise-recent-projects'),
  version: z.literal(1),
  projects: z.array(z.object({ path: z.string().min(1), openedAt: z.iso.datetime({ offset: true }) })),
});
type Stored = z.infer<typeof storedSchema>['projects'];

export interface RecentProject {
  path: string;
  /** File name without the extension. */
  name: string;
  openedAt: string;
  /** True when the file is no longer there. */
  missing: boolean;
}

const samePath = (a: string, b: string) => (process.platform === 'win32' ? a.toLowerCase() === b.toLowerCase() : a === b);

/** The stored list; an absent or unreadable list file counts as an empty list. */
async function readStored(userDataDir: string): Promise<Stored> {
  try {
    const parsed = storedSchema.safeParse(JSON.parse(await readFile(join(userDataDir, RECENT_FILE_NAME), 'utf8')));
    return parsed.success ? parsed.data.projects : [];
  } catch {
    return [];
  }
}

async function writeStored(userDataDir: string, projects: Stored): Promise<void> {
  await mkdir(userDataDir, { recursive: true });
  const body = JSON.stringify({ kind: 'tallywise-recent-projects', version: 1, projects }, null, 2);
  await replaceFile(join(userDataDir, RECENT_FILE_NAME), new TextEncoder().encode(body));
}

async function exists(path: string): Promise<boolean> {
  try {
    return (await stat(path)).isFile();
  } catch {
    return false;
  }
}

async function withStatus(projects: Stored): Promise<RecentProject[]> {
  return Promise.all(projects.map(async (p) => ({ ...p, name: projectDisplayName(p.path), missing: !(await exists(p.path)) })));
}

export async function listRecentProjects(userDataDir: string): Promise<RecentProject[]> {
  return withStatus(await readStored(userDataDir));
}

/** Puts a project at the top of the list (moving it if it was there) and keeps the ten most recent. */
export async function addRecentProject(userDataDir: string, projectPath: string, now: Date = new Date()): Promise<RecentProject[]> {
  const path = resolve(projectPath);
  const rest = (await readStored(userDataDir)).filter((p) => !samePath(p.path, path));
  const projects = [{ path, openedAt: now.toISOString() }, ...rest].slice(0, MAX_RECENT);
  await writeStored(userDataDir, projects);
  return withStatus(projects);
}

export async function removeRecentProject(userDataDir: string, projectPath: string): Promise<RecentProject[]> {
  const path = resolve(projectPath);
  const projects = (await readStored(userDataDir)).filter((p) => !samePath(p.path, path));
  await writeStored(userDataDir, projects);
  return withStatus(projects);
}
