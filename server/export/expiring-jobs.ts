import { rm } from 'node:fs/promises';

/** One hour: jobs and their files are kept this long after they start (exports and imports alike). */
export const JOB_LIFETIME_MS = 60 * 60 * 1000;

/**
 * Background jobs kept in memory for a limited time. A job past its lifetime is gone: it is
 * dropped on the next look-up or sweep, and its files are deleted. Jobs live in this process
 * only; a restart forgets them (their files are swept by the owner at start-up).
 */
export class ExpiringJobs<Job> {
  private readonly entries = new Map<string, { job: Job; expiresAt: number }>();

  constructor(
    /** Files a job leaves on disk, deleted when it expires. */
    private readonly filesOf: (job: Job) => readonly string[],
    private readonly lifetimeMs = JOB_LIFETIME_MS,
    private readonly now: () => number = Date.now,
  ) {}

  add(id: string, job: Job): void {
    this.entries.set(id, { job, expiresAt: this.now() + this.lifetimeMs });
  }

  /** The job, or undefined when it never existed or has expired. */
  get(id: string): Job | undefined {
    const entry = this.entries.get(id);
    if (!entry) return undefined;
    if (entry.expiresAt <= this.now()) {
      void this.expire(id, entry.job);
      return undefined;
    }
    return entry.job;
  }

  /** Drops every expired job and deletes its files. */
  async sweep(): Promise<void> {
    const now = this.now();
    await Promise.all([...this.entries].filter(([, entry]) => entry.expiresAt <= now).map(([id, entry]) => this.expire(id, entry.job)));
  }

  /** Sweeps every `intervalMs` without keeping the process alive; returns the stop function. */
  startSweeping(intervalMs = 5 * 60 * 1000): () => void {
    const timer = setInterval(() => void this.sweep(), intervalMs);
    timer.unref();
    return () => clearInterval(timer);
  }

  private async expire(id: string, job: Job): Promise<void> {
    this.entries.delete(id);
    await Promise.all(this.filesOf(job).map((file) => rm(file, { force: true })));
  }
}
