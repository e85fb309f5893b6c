import { importCancelledName } from '../../src-shared/host/channels';
import { ImportError, type ImportPlace } from '../../src-shared/import/import-error';

/**
 * An import stopped on request. It is an ImportError with the code
 * 'cancelled' (the command line branches on codes) under its own stable name
 * (the page branches on names); nothing of the import is kept.
 */
export class ImportCancelled extends ImportError {
  constructor(file: string, place: Omit<ImportPlace, 'file'> = {}) {
    super('cancelled', `Reading ${file} was cancelled; nothing of it was added.`, { file, ...place });
    this.name = importCancelledName;
  }
}

/** Throws ImportCancelled when the signal says stop. */
export function stopIfCancelled(signal: AbortSignal | undefined, file: string, place: Omit<ImportPlace, 'file'> = {}): void {
  if (signal?.aborted) throw new ImportCancelled(file, place);
}
