import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Reproducibility reruns (made before a PI signs) go through the shared run queue as analysis_run
 * rows of their own kind, and ended runs are pruned by age across every cell.
 */
export class ReproducibilityRuns1796224000000 implements MigrationInterface {
  name = 'ReproducibilityRuns1796224000000';

  async up(q: QueryRunner): Promise<void> {
    // What a run is for: a person's run of the cell, or a rerun for the reproducibility check.
    await q.query(`
      ALTER TABLE analysis_run
        ADD COLUMN purpose text NOT NULL DEFAULT 'cell'
          CONSTRAINT analysis_run_purpose_check CHECK (purpose IN ('cell', 'reproducibility'))`);
    // One run in progress per cell counts only the cell's own runs: a rerun neither supersedes them nor is superseded.
    await q.query(`DROP INDEX analysis_run_active_cell_idx`);
    await q.query(`CREATE UNIQUE INDEX analysis_run_active_cell_idx ON analysis_run (entry_id, cell_id) WHERE status IN ('queued', 'running') AND purpose = 'cell'`);
    // The periodic clean-up of runs that ended long ago.
    await q.query(`CREATE INDEX analysis_run_finished_idx ON analysis_run (finished_at) WHERE finished_at IS NOT NULL`);
  }

  async down(q: QueryRunner): Promise<void> {
    // The clean-up's index.
    await q.query(`DROP INDEX analysis_run_finished_idx`);
    // Reruns leave with their column; the one-run-per-cell index covers every row again.
    await q.query(`DELETE FROM analysis_run WHERE purpose = 'reproducibility'`);
    await q.query(`DROP INDEX analysis_run_active_cell_idx`);
    await q.query(`CREATE UNIQUE INDEX analysis_run_active_cell_idx ON analysis_run (entry_id, cell_id) WHERE status IN ('queued', 'running')`);
    // The column itself.
    await q.query(`ALTER TABLE analysis_run DROP COLUMN purpose`);
  }
}
