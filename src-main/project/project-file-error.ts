/**
 * Why a project file could not be opened or saved. `code` is stable so the
 * UI can branch on it; `message` names the file and says what to do.
 *
 * - `damaged`: ours, but cut off, altered or not decodable.
 * - `foreign`: not a Tallywise project file at all.
 * - `newer-version`: written by a newer Tallywise than this one.
 * - `unreadable`: the file could not be read (missing, no permission, a folder).
 * - `unwritable`: saving failed (no permission, disk full); the previous file is unchanged.
 */
export type ProjectFileErrorCode = 'damaged' | 'foreign' | 'newer-version' | 'unreadable' | 'unwritable';

export class ProjectFileError extends Error {
  constructor(
    readonly code: ProjectFileErrorCode,
    readonly file: string,
    message: string,
  ) {
    super(message);
    this.name = 'ProjectFileError';
  }
}
