import PgBoss from 'pg-boss';
import { RunNotifications } from './run-notifications.ts';

/** The pg-boss queue of cell runs. */
export const ANALYSIS_QUEUE = 'analysis-run';

/** What a job carries: the run's row holds everything else. */
export interface AnalysisJobData {
  runId: string;
}

/** Where a run's job is in pg-boss; null once it has been archived and removed. */
export type AnalysisJobState = PgBoss.JobWithMetadata['state'] | null;

/** How a request waits for its run. */
export interface RunWaitLimits {
  /** Longest wait in the queue for a free worker before the run fails as "queue busy". */
  queueWaitMs: number;
  /** Slow polling of the run's row, in case a notification was lost. */
  pollMs: number;
}
export const DEFAULT_RUN_WAIT: RunWaitLimits = { queueWaitMs: 60_000, pollMs: 2_000 };

/** Time between two sweeps of ended runs on each instance. */
const DEFAULT_SWEEP_INTERVAL_MS = 10 * 60_000;

/** Seconds a job may stay with its worker past the run's hard limit before pg-boss fails it. */
const EXPIRY_MARGIN_SECONDS = 30;

export interface RunQueueOptions {
  databaseUrl: string;
  /** Workers on this instance (the piscina pool's threads); 0: this instance only queues runs. */
  workers: number;
  /** Takes a job and runs it to its end; errors fail the job (never retried). */
  handle: (job: AnalysisJobData, notifications: RunNotifications) => Promise<void>;
  /** How often an idle worker asks for a job another instance queued (default 1 s). */
  pollingIntervalSeconds?: number;
  /** How often one instance fails jobs whose worker went quiet past their expiry (default 30 s). */
  maintenanceIntervalSeconds?: number;
  wait?: Partial<RunWaitLimits>;
  /** Clean-up every instance runs now and then (ended runs' rows); its failures are logged and tried again at the next turn. */
  sweep?: () => Promise<unknown>;
  /** Time between sweeps (default 10 minutes; the first comes one interval after start). */
  sweepIntervalMs?: number;
}

/**
 * The cell-run queue shared by every instance, in PostgreSQL (pg-boss, its own `pgboss` schema),
 * and this instance's part in it: its workers (as many as its analysis threads) and the one
 * connection that listens for run notifications. Jobs are never retried: an engine error is an
 * answer. A job whose worker stops answering (its instance died) is failed by pg-boss's
 * maintenance once it passes its expiry, which the waiting request then reports.
 */
export class RunQueue {
  private readonly workerIds: string[] = [];
  private sweepTimer: NodeJS.Timeout | null = null;
  private sweeping: Promise<unknown> | null = null;

  private constructor(
    private readonly boss: PgBoss,
    readonly notifications: RunNotifications,
    readonly wait: RunWaitLimits,
    private readonly maintenanceIntervalSeconds: number,
  ) {}

  /** Runs `sweep` every `intervalMs`, never two at once, without keeping the process alive. */
  private startSweeping(sweep: () => Promise<unknown>, intervalMs: number): void {
    this.sweepTimer = setInterval(() => {
      this.sweeping ??= sweep()
        .catch((error: Error) => console.error(`[run-queue] sweep: ${error.message}`))
        .finally(() => {
          this.sweeping = null;
        });
    }, intervalMs);
    this.sweepTimer.unref();
  }

  /** How long a job may stay with its worker (counted from when the worker takes it). */
  static expireInSeconds(hardLimitMs: number): number {
    return Math.ceil(hardLimitMs / 1000) + EXPIRY_MARGIN_SECONDS;
  }

  /** Past this time on a worker, pg-boss has failed the job for sure (expiry plus maintenance passes). */
  runningLimitMs(hardLimitMs: number): number {
    return (RunQueue.expireInSeconds(hardLimitMs) + 2 * this.maintenanceIntervalSeconds) * 1000;
  }

  static async start(options: RunQueueOptions): Promise<RunQueue> {
    const maintenanceIntervalSeconds = options.maintenanceIntervalSeconds ?? 30;
    const boss = new PgBoss({
      connectionString: options.databaseUrl,
      application_name: 'bifolio-run-queue',
      max: 2 + options.workers,
      schedule: false,
      maintenanceIntervalSeconds,
      retryLimit: 0,
    });
    boss.on('error', (error: Error) => console.error(`[run-queue] ${error.message}`));
    await boss.start();
    await boss.createQueue(ANALYSIS_QUEUE, { name: ANALYSIS_QUEUE, policy: 'standard', retryLimit: 0 });
    const notifications = new RunNotifications(options.databaseUrl);
    const queue = new RunQueue(boss, notifications, { ...DEFAULT_RUN_WAIT, ...options.wait }, maintenanceIntervalSeconds);
    try {
      await notifications.start();
      for (let i = 0; i < options.workers; i += 1) {
        // After a job the worker asks again at once: pg-boss would otherwise wait out the rest of
        // its polling interval, and a backlog would drain at one run per second per worker.
        let id = '';
        id = await boss.work<AnalysisJobData>(
          ANALYSIS_QUEUE,
          { batchSize: 1, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 1 },
          async ([job]) => {
            if (!job) return;
            try {
              await options.handle(job.data, notifications);
            } finally {
              if (id) boss.notifyWorker(id);
            }
          },
        );
        queue.workerIds.push(id);
      }
      if (options.sweep) queue.startSweeping(options.sweep, options.sweepIntervalMs ?? DEFAULT_SWEEP_INTERVAL_MS);
    } catch (error) {
      await queue.stop();
      throw error;
    }
    return queue;
  }

  /**
   * Queues a run's job (with the id stored on its row) and wakes this instance's idle workers at
   * once; other instances pick it up at their next poll. The job expires a little after the
   * run's hard limit, counted from when a worker takes it.
   */
  async send(jobId: string, data: AnalysisJobData, hardLimitMs: number): Promise<void> {
    const id = await this.boss.send(ANALYSIS_QUEUE, data, { id: jobId, retryLimit: 0, expireInSeconds: RunQueue.expireInSeconds(hardLimitMs) });
    if (!id) throw new Error('The run queue did not accept the job');
    for (const workerId of this.workerIds) this.boss.notifyWorker(workerId);
  }

  /** Cancels jobs still waiting (a job a worker already took is stopped through its row). */
  async cancel(jobIds: string[]): Promise<void> {
    if (jobIds.length) await this.boss.cancel(ANALYSIS_QUEUE, jobIds);
  }

  async jobState(jobId: string): Promise<AnalysisJobState> {
    const job = await this.boss.getJobById(ANALYSIS_QUEUE, jobId, { includeArchive: true });
    return job?.state ?? null;
  }

  /**
   * Stops taking jobs, lets runs in progress end for up to `timeoutMs` (pg-boss then fails them,
   * and their waiting requests say so), and closes the connections.
   */
  async stop(timeoutMs = 10_000): Promise<void> {
    if (this.sweepTimer) clearInterval(this.sweepTimer);
    await this.sweeping;
    await this.boss.stop({ graceful: true, wait: true, timeout: timeoutMs }).catch((error: Error) => {
      console.error(`[run-queue] stop: ${error.message}`);
    });
    await this.notifications.stop();
  }
}
