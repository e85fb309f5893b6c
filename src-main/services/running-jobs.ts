/**
 * The long jobs running now, by the id the page gave each, so that a cancel
 * call can stop one. A job without an id cannot be cancelled.
 */
export class RunningJobs {
  private readonly jobs = new Map<string, AbortController>();

  /** Runs `work` under `jobId` with a signal that `cancel(jobId)` aborts. */
  async run<T>(jobId: string | undefined, work: (signal: AbortSignal | undefined) => Promise<T>): Promise<T> {
    if (!jobId) return work(undefined);
    if (this.jobs.has(jobId)) throw Object.assign(new Error(`A job named "${jobId}" is already running; give each job its own id.`), { name: 'JobIdInUse' });
    const controller = new AbortController();
    this.jobs.set(jobId, controller);
    try {
      return await work(controller.signal);
    } finally {
      this.jobs.delete(jobId);
    }
  }

  /** True when the job was running and is now told to stop. */
  cancel(jobId: string): boolean {
    const controller = this.jobs.get(jobId);
    if (!controller || controller.signal.aborted) return false;
    controller.abort();
    return true;
  }
}
