import type { CliIO } from './command';

/** Progress lines to stderr: one per stage and tenth done, repeats skipped. */
export function progressPrinter(io: CliIO): (done: number, total: number, stage: string) => void {
  let last = '';
  return (done, total, stage) => {
    const tenth = total > 1 ? Math.floor((10 * done) / total) : -1;
    const key = `${stage}:${tenth}`;
    if (key === last) return;
    last = key;
    io.err(total > 1 ? `${stage}: ${done} of ${total}` : `${stage} ...`);
  };
}
