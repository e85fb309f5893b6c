// Atomic file replacement, kept free of any dependency (Node built-ins only)
// so the crash test can run this very code in a plain `node` child process.
//
// replaceFile(target, bytes, { backupPath }):
//   1. write the bytes to a new temporary file in the target's folder, flush it;
//   2. if backupPath is given and the target exists: hard-link (or, where links
//      are not possible, copy and flush) the target to a temporary name and
//      rename that over backupPath;
//   3. rename the temporary file over the target; flush the folder.
// A crash at any moment leaves the target either the old or the new file,
// and the backup either the old backup or the old target.
import { randomBytes } from 'node:crypto';
import { copyFile, link, open, rename, unlink } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';

export function temporaryPathFor(target) {
  return join(dirname(target), `.${basename(target)}.${process.pid}-${randomBytes(4).toString('hex')}.tmp`);
}

async function writeFlushed(path, bytes) {
  const handle = await open(path, 'wx', 0o644);
  try {
    await handle.writeFile(bytes);
    await handle.sync();
  } finally {
    await handle.close();
  }
}

async function flushFile(path) {
  const handle = await open(path, 'r+');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

async function flushFolder(folder) {
  try {
    const handle = await open(folder, 'r');
    try {
      await handle.sync();
    } finally {
      await handle.close();
    }
  } catch {
    // Folders cannot be opened or flushed on some systems (Windows); the rename is still atomic there.
  }
}

const retryable = new Set(['EPERM', 'EACCES', 'EBUSY']);

// On Windows a rename over a file another program has open briefly fails; try a few times.
async function renameOver(from, to) {
  for (let attempt = 0; ; attempt++) {
    try {
      await rename(from, to);
      return;
    } catch (err) {
      if (process.platform !== 'win32' || attempt >= 5 || !retryable.has(err && err.code)) throw err;
      await new Promise((r) => setTimeout(r, 50 * (attempt + 1)));
    }
  }
}

async function keepBackup(target, backupPath) {
  const tmp = temporaryPathFor(backupPath);
  try {
    try {
      await link(target, tmp);
    } catch (err) {
      if (err && err.code === 'ENOENT') return false; // nothing to back up yet
      await copyFile(target, tmp);
      await flushFile(tmp);
    }
    await renameOver(tmp, backupPath);
    return true;
  } catch (err) {
    await unlink(tmp).catch(() => {});
    throw err;
  }
}

export async function replaceFile(target, bytes, options = {}) {
  const tmp = temporaryPathFor(target);
  try {
    await writeFlushed(tmp, bytes);
    if (options.backupPath) await keepBackup(target, options.backupPath);
    await renameOver(tmp, target);
  } catch (err) {
    await unlink(tmp).catch(() => {});
    throw err;
  }
  await flushFolder(dirname(target));
}
