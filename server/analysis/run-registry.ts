/** One cell run the server has accepted and not finished. */
export interface ActiveRun {
  entryId: string;
  cellId: string;
  startedBy: { id: string; name: string };
  /** When the request came in. */
  acceptedAt: Date;
  /** When a worker picked it up; null while it waits for one. */
  startedAt: Date | null;
  budgetMs: number;
  /** Aborting it cancels the run. */
  controller: AbortController;
}

/**
 * The runs in progress in this server process, one per cell: what the progress view shows and
 * what "cancel" stops. Starting a cell again supersedes (cancels) its earlier run.
 */
export class RunRegistry {
  private readonly runs = new Map<string, ActiveRun>();

  private static key(entryId: string, cellId: string): string {
    return `${entryId}/${cellId}`;
  }

  begin(props: Omit<ActiveRun, 'acceptedAt' | 'startedAt' | 'controller'>): ActiveRun {
    const key = RunRegistry.key(props.entryId, props.cellId);
    this.runs.get(key)?.controller.abort();
    const run: ActiveRun = { ...props, acceptedAt: new Date(), startedAt: null, controller: new AbortController() };
    this.runs.set(key, run);
    return run;
  }

  markStarted(run: ActiveRun): void {
    run.startedAt = new Date();
  }

  finish(run: ActiveRun): void {
    const key = RunRegistry.key(run.entryId, run.cellId);
    if (this.runs.get(key) === run) this.runs.delete(key);
  }

  get(entryId: string, cellId: string): ActiveRun | null {
    return this.runs.get(RunRegistry.key(entryId, cellId)) ?? null;
  }

  /** Cancels the cell's run; false when none is in progress. */
  cancel(entryId: string, cellId: string): boolean {
    const run = this.get(entryId, cellId);
    if (!run) return false;
    run.controller.abort();
    this.finish(run);
    return true;
  }
}

/** The server's registry. */
export const runRegistry = new RunRegistry();
