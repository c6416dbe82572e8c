import pg from 'pg';

/**
 * PostgreSQL channels about cell runs; the payload is the run id. A NOTIFY sent inside a
 * transaction is delivered when it commits, so a listener that wakes always reads the new row.
 */
export const RUN_CHANNELS = {
  /** The run is over (finished, failed or cancelled): its waiting request can answer. */
  settled: 'analysis_run_settled',
  /** The run was cancelled: the instance running it stops its worker. */
  cancelled: 'analysis_run_cancelled',
} as const;
export type RunChannel = (typeof RUN_CHANNELS)[keyof typeof RUN_CHANNELS];

type Listener = () => void;

/**
 * One listening connection per instance, handing each notification to the callbacks registered
 * for that run id. A lost connection is opened again after a short pause; notifications sent in
 * between are lost, which is why every waiter also polls the row now and then.
 */
export class RunNotifications {
  private client: pg.Client | null = null;
  private readonly listeners = new Map<RunChannel, Map<string, Set<Listener>>>(
    Object.values(RUN_CHANNELS).map((channel) => [channel, new Map()]),
  );
  private stopped = false;
  private reconnectTimer: NodeJS.Timeout | null = null;

  constructor(
    private readonly databaseUrl: string,
    private readonly reconnectMs = 1000,
  ) {}

  /** Opens the listening connection (resolves once LISTEN is in place). */
  async start(): Promise<void> {
    const client = new pg.Client({ connectionString: this.databaseUrl, application_name: 'bifolio-run-notifications' });
    client.on('notification', (message) => {
      const waiting = this.listeners.get(message.channel as RunChannel)?.get(message.payload ?? '');
      for (const listener of [...(waiting ?? [])]) listener();
    });
    client.on('error', (error) => {
      console.error(`[run-notifications] connection lost: ${error.message}`);
      this.reconnect(client);
    });
    client.on('end', () => this.reconnect(client));
    await client.connect();
    for (const channel of Object.values(RUN_CHANNELS)) await client.query(`LISTEN ${channel}`);
    this.client = client;
  }

  /** Drops a connection that failed or ended, and listens again after a pause. */
  private reconnect(lost: pg.Client): void {
    if (this.client !== lost) return;
    this.client = null;
    lost.removeAllListeners('end');
    void lost.end().catch(() => undefined);
    this.scheduleStart();
  }

  private scheduleStart(): void {
    if (this.stopped || this.reconnectTimer) return;
    this.reconnectTimer = setTimeout(() => {
      this.reconnectTimer = null;
      if (this.stopped) return;
      this.start().catch((error: Error) => {
        console.error(`[run-notifications] could not listen again: ${error.message}`);
        this.scheduleStart();
      });
    }, this.reconnectMs);
    this.reconnectTimer.unref();
  }

  /** Calls `listener` on each notification about `runId` on `channel`; returns the way to stop. */
  on(channel: RunChannel, runId: string, listener: Listener): () => void {
    const byRun = this.listeners.get(channel);
    if (!byRun) throw new Error(`Unknown run channel ${channel}`);
    const set = byRun.get(runId) ?? new Set<Listener>();
    set.add(listener);
    byRun.set(runId, set);
    return () => {
      set.delete(listener);
      if (set.size === 0 && byRun.get(runId) === set) byRun.delete(runId);
    };
  }

  async stop(): Promise<void> {
    this.stopped = true;
    if (this.reconnectTimer) clearTimeout(this.reconnectTimer);
    const client = this.client;
    this.client = null;
    if (client) {
      client.removeAllListeners('end');
      await client.end().catch(() => undefined);
    }
  }
}
