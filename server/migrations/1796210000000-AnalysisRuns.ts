import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Shared state of several server instances: cell runs as rows any instance can read, wait on and
 * cancel (the jobs themselves are in pg-boss's own schema), and the rate-limit counters.
 */
export class AnalysisRuns1796210000000 implements MigrationInterface {
  name = 'AnalysisRuns1796210000000';

  async up(q: QueryRunner): Promise<void> {
    // Cell runs: accepted by one instance, run by whichever has a free worker, answered from the row.
    await q.query(`
      CREATE TABLE analysis_run (
        id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
        notebook_id uuid NOT NULL REFERENCES notebook (id) ON DELETE CASCADE,
        entry_id uuid NOT NULL REFERENCES entry (id) ON DELETE CASCADE,
        cell_id uuid NOT NULL,
        input_hash text NOT NULL,
        request jsonb NOT NULL,
        started_by_id uuid NOT NULL REFERENCES app_user (id),
        status text NOT NULL DEFAULT 'queued'
          CONSTRAINT analysis_run_status_check CHECK (status IN ('queued', 'running', 'finished', 'failed', 'cancelled')),
        budget_ms integer NOT NULL CONSTRAINT analysis_run_budget_check CHECK (budget_ms > 0),
        job_id uuid,
        instance text,
        output jsonb,
        queued_at timestamptz NOT NULL DEFAULT now(),
        started_at timestamptz,
        finished_at timestamptz,
        CONSTRAINT analysis_run_output_check CHECK ((status IN ('queued', 'running')) = (output IS NULL))
      )`);
    // At most one run in progress per cell: a new run supersedes (cancels) the earlier one.
    await q.query(`CREATE UNIQUE INDEX analysis_run_active_cell_idx ON analysis_run (entry_id, cell_id) WHERE status IN ('queued', 'running')`);
    // A cell's runs, newest first.
    await q.query(`CREATE INDEX analysis_run_cell_idx ON analysis_run (entry_id, cell_id, queued_at DESC)`);

    // Rate-limit counters: one row per limiter and key, reset when its window ends.
    await q.query(`
      CREATE TABLE rate_limit_hit (
        limiter text NOT NULL,
        key text NOT NULL,
        hits integer NOT NULL CONSTRAINT rate_limit_hit_hits_check CHECK (hits >= 0),
        reset_at timestamptz NOT NULL,
        PRIMARY KEY (limiter, key)
      )`);
    // Pruning windows that have ended.
    await q.query(`CREATE INDEX rate_limit_hit_reset_idx ON rate_limit_hit (reset_at)`);
  }

  async down(q: QueryRunner): Promise<void> {
    // Rate-limit counters.
    await q.query(`DROP TABLE rate_limit_hit`);
    // Cell runs (pg-boss's schema is its own and stays).
    await q.query(`DROP TABLE analysis_run`);
  }
}
