import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { RunCellResponse } from '@shared/api/entries.ts';
import type { UserEntity } from './user.entity.ts';

/** Where a run is: waiting in the queue, on a worker, or done (with its output). */
export const ANALYSIS_RUN_STATUSES = ['queued', 'running', 'finished', 'failed', 'cancelled'] as const;
export type AnalysisRunStatus = (typeof ANALYSIS_RUN_STATUSES)[number];
/** The statuses of a run in progress (at most one per cell). */
export const ACTIVE_RUN_STATUSES: readonly AnalysisRunStatus[] = ['queued', 'running'];

/** What a run is for: a person's run of the cell, or a rerun for the reproducibility check before signing. */
export const ANALYSIS_RUN_PURPOSES = ['cell', 'reproducibility'] as const;
export type AnalysisRunPurpose = (typeof ANALYSIS_RUN_PURPOSES)[number];

/** The engine request a run computes (as validated by the run route; the budget is a column). */
export interface AnalysisRunRequest {
  model: unknown;
  task: { kind?: unknown } & Record<string, unknown>;
  timeLimitMs?: number;
}

/**
 * One cell run, shared by every server instance: the instance that accepted the request waits on
 * it, whichever instance has a free worker runs it (`instance`), and any instance shows its
 * progress or cancels it. "finished": the engine answered (a result or a request error);
 * "failed": the run could not be computed (the queue stayed busy, the instance running it
 * stopped); "cancelled": superseded, cancelled, or its caller went away. A run that is over
 * holds the answer the waiting request sends (`output`, the RunCellResponse shape).
 * A "reproducibility" run is a rerun for the check before signing: it is never superseded by
 * (and never supersedes) the cell's own runs, and stores neither a result nor an audit event.
 */
@Entity({ name: 'analysis_run' })
export class AnalysisRunEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'notebook_id' })
  notebookId: string;

  @Column({ type: 'uuid', name: 'entry_id' })
  entryId: string;

  @Column({ type: 'uuid', name: 'cell_id' })
  cellId: string;

  @Column({ type: 'text', name: 'input_hash' })
  inputHash: string;

  @Column({ type: 'jsonb' })
  request: AnalysisRunRequest;

  @Column({ type: 'uuid', name: 'started_by_id' })
  startedById: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'started_by_id' })
  startedBy?: Relation<UserEntity>;

  @Column({ type: 'text' })
  purpose: AnalysisRunPurpose;

  @Column({ type: 'text' })
  status: AnalysisRunStatus;

  /** The engine's time budget; it starts when a worker picks the run up, not while it waits. */
  @Column({ type: 'integer', name: 'budget_ms' })
  budgetMs: number;

  /** The pg-boss job that carries the run. */
  @Column({ type: 'uuid', name: 'job_id', nullable: true })
  jobId: string | null;

  /** INSTANCE_NAME of the instance whose worker ran it. */
  @Column({ type: 'text', nullable: true })
  instance: string | null;

  @Column({ type: 'jsonb', nullable: true })
  output: RunCellResponse | null;

  @Column({ type: 'timestamptz', name: 'queued_at' })
  queuedAt: Date;

  @Column({ type: 'timestamptz', name: 'started_at', nullable: true })
  startedAt: Date | null;

  @Column({ type: 'timestamptz', name: 'finished_at', nullable: true })
  finishedAt: Date | null;
}
