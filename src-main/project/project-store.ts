import { access, readFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { parseProjectDocument, ProjectDocumentError, type ProjectDocument } from '@shared/project/document';
import { migrateToCurrent, versionOf } from '@shared/project/migrations';
import { CURRENT_FORMAT_VERSION } from '@shared/project/schema';
import { ContainerError, decodeContainer, encodeContainer } from './file-format';
import { nodeErrorCode } from './node-error-code';
import { backupPathFor } from './project-paths';
import { ProjectFileError } from './project-file-error';
import { replaceFile } from './replace-file.mjs';

/**
 * Saving and opening project files. Saving is atomic and keeps the previous
 * file as `<name>.tallywise.bak`; opening never writes anything, and older
 * formats are converted in memory only.
 */

export interface LoadedProject {
  document: ProjectDocument;
  /** The version the file was written in; lower than the current one when it was converted. */
  fileFormatVersion: number;
  /** The conversion steps run, oldest first (empty when the file was current). */
  migrationSteps: string[];
}

/** The project document as the bytes of a `.tallywise` file. */
export function encodeProject(doc: ProjectDocument): Uint8Array {
  return encodeContainer(parseProjectDocument(doc), CURRENT_FORMAT_VERSION);
}

const readProblems: Record<string, string> = {
  ENOENT: 'there is no such file. Check the folder and name, or choose it again from the file dialog',
  EACCES: 'permission to read it was refused. Ask for read access or copy the file somewhere you can read',
  EPERM: 'permission to read it was refused. Ask for read access or copy the file somewhere you can read',
  EISDIR: 'it is a folder, not a file. Choose the .tallywise file inside it',
};

/** Turns decoded bytes into a current document, or a ProjectFileError naming the file. */
export function decodeProject(bytes: Uint8Array, path: string): LoadedProject {
  const name = basename(path);
  const backup = basename(backupPathFor(path));
  const damagedError = (detail: string) =>
    new ProjectFileError(
      'damaged',
      path,
      `"${name}" is damaged: ${detail}. It was left as it is. Open the backup "${backup}" or a recovery file instead, or restore the file from a copy.`,
    );
  let decoded: { formatVersion: number; body: unknown };
  try {
    decoded = decodeContainer(bytes, CURRENT_FORMAT_VERSION);
  } catch (err) {
    if (!(err instanceof ContainerError)) throw err;
    const f = err.fault;
    if (f.kind === 'foreign') {
      throw new ProjectFileError('foreign', path, `"${name}" is not a Tallywise project file. Open a .tallywise file, or import a workbook (.xlsx or .csv) from the Import step instead.`);
    }
    if (f.kind === 'newer-version') {
      throw new ProjectFileError(
        'newer-version',
        path,
        `"${name}" was saved by a newer Tallywise (project format ${f.version}; this version reads up to ${CURRENT_FORMAT_VERSION}). Update Tallywise to open it; the file was left as it is.`,
      );
    }
    throw damagedError(f.detail);
  }
  if (versionOf(decoded.body) !== decoded.formatVersion) {
    throw damagedError(`its header says format ${decoded.formatVersion} but its content says ${String(versionOf(decoded.body) ?? 'nothing')}`);
  }
  try {
    const migrated = migrateToCurrent(decoded.body);
    return { document: parseProjectDocument(migrated.doc, 'its content'), fileFormatVersion: decoded.formatVersion, migrationSteps: migrated.steps };
  } catch (err) {
    if (err instanceof ProjectDocumentError) throw damagedError(err.message.replace(/\.$/, ''));
    throw err;
  }
}

/** Opens a project file. Nothing on disk is changed, whatever the outcome. */
export async function loadProject(path: string): Promise<LoadedProject> {
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch (err) {
    const why = readProblems[nodeErrorCode(err) ?? ''] ?? `the system said: ${err instanceof Error ? err.message : String(err)}`;
    throw new ProjectFileError('unreadable', path, `"${basename(path)}" cannot be opened: ${why}.`);
  }
  return decodeProject(bytes, path);
}

/**
 * True when the file about to be replaced is a damaged project file and a
 * backup exists: then the backup (likely good) is kept rather than replaced
 * by the damaged file. Anything else being replaced (a sound project, a
 * foreign file, a newer one) becomes the backup.
 */
async function damagedWithGoodBackup(path: string): Promise<boolean> {
  let bytes: Uint8Array;
  try {
    bytes = await readFile(path);
  } catch {
    return false;
  }
  try {
    decodeContainer(bytes, Number.MAX_SAFE_INTEGER);
    return false;
  } catch (err) {
    if (!(err instanceof ContainerError) || err.fault.kind !== 'damaged') return false;
  }
  return access(backupPathFor(path)).then(
    () => true,
    () => false,
  );
}

/**
 * Saves atomically (temporary file in the same folder, flush, rename over)
 * and keeps the file it replaces as `<name>.tallywise.bak` (unless that file
 * is a damaged project and a backup exists already). If saving fails, the
 * previous file is still there, unchanged.
 */
export async function saveProject(path: string, doc: ProjectDocument): Promise<void> {
  const bytes = encodeProject(doc);
  try {
    const backupPath = (await damagedWithGoodBackup(path)) ? undefined : backupPathFor(path);
    await replaceFile(path, bytes, { backupPath });
  } catch (err) {
    const code = nodeErrorCode(err);
    const why =
      code === 'ENOSPC'
        ? 'the disk is full. Free some space or save to another disk'
        : code === 'EACCES' || code === 'EPERM' || code === 'EROFS'
          ? 'permission to write in that folder was refused. Save to a folder you can write to'
          : code === 'ENOENT'
            ? 'the folder does not exist. Choose an existing folder'
            : `the system said: ${err instanceof Error ? err.message : String(err)}`;
    throw new ProjectFileError('unwritable', path, `"${basename(path)}" could not be saved: ${why}. The previous version of the file is unchanged.`);
  }
}
