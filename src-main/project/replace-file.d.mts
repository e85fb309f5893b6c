/** Types of replace-file.mjs (plain JavaScript so a bare `node` child can run it). */
export interface ReplaceFileOptions {
  /** Keep the file being replaced under this name (replacing the previous backup). */
  backupPath?: string;
}
/** Writes `bytes` to `target` atomically: temporary file, flush, rename over. */
export function replaceFile(target: string, bytes: Uint8Array, options?: ReplaceFileOptions): Promise<void>;
/** A unique temporary name in the same folder as `target`. */
export function temporaryPathFor(target: string): string;
