import { useCallback, useEffect, useRef, useState } from 'react';
import { HostError, importCancelledName, type ChannelInput, type ChannelOutput, type JobProgress } from '@shared/host/contract';
import { call, onHostProgress } from '../../host';

/**
 * The workbook import running in the host, if any: its progress as the host
 * reports it, and a cancel. A cancelled import resolves to null with a note
 * (nothing of the file reaches the project); other failures are thrown.
 */
export interface ImportJob {
  jobId: string;
  fileName: string;
  progress: JobProgress | null;
  /** Cancel was asked; the host stops at its next check. */
  cancelling: boolean;
}

type ReadInput = Omit<ChannelInput<'import:read-workbook'>, 'jobId'>;

let jobs = 0;

export function useImportJob() {
  const [job, setJob] = useState<ImportJob | null>(null);
  const [note, setNote] = useState<string | null>(null);
  const active = useRef<string | null>(null);

  useEffect(
    () =>
      onHostProgress((progress) => {
        if (progress.jobId === active.current) setJob((j) => (j && j.jobId === progress.jobId ? { ...j, progress } : j));
      }),
    [],
  );

  const read = useCallback(async (fileName: string, input: ReadInput): Promise<ChannelOutput<'import:read-workbook'> | null> => {
    if (active.current) {
      setNote(`Another workbook is being imported; wait for it to end or cancel it, then import ${fileName}.`);
      return null;
    }
    const jobId = `import-${++jobs}`;
    active.current = jobId;
    setNote(null);
    setJob({ jobId, fileName, progress: null, cancelling: false });
    try {
      return await call('import:read-workbook', { ...input, jobId });
    } catch (err) {
      if (!(err instanceof HostError && err.name === importCancelledName)) throw err;
      setNote(`The import of ${fileName} was cancelled. Nothing of it was added: the project is as it was before.`);
      return null;
    } finally {
      active.current = null;
      setJob(null);
    }
  }, []);

  const cancel = useCallback(() => {
    const jobId = active.current;
    if (!jobId) return;
    setJob((j) => (j && j.jobId === jobId ? { ...j, cancelling: true } : j));
    // Too late (the import had ended) answers { cancelled: false }; the records then arrive as usual.
    call('import:cancel', { jobId }).catch(() => undefined);
  }, []);

  return { job, note, read, cancel, dismissNote: useCallback(() => setNote(null), []) };
}
