import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';
import type { AnalyzeResult } from '@shared/engine/contract.ts';

/**
 * A finished engine run, kept so the same request is not computed twice and so a recorded output
 * can be checked against what the server computed. Keyed by the input hash: sha256 hex of
 * canonicalJson({ engineVersion, model, task }). Only successful runs are stored (a bad request is
 * answered again, quickly, by the engine's checks); a run cut short by its time budget is stored
 * but not reused.
 */
@Entity({ name: 'analysis_result' })
export class AnalysisResultEntity {
  @PrimaryColumn({ type: 'text', name: 'input_hash' })
  inputHash: string;

  @Column({ type: 'text', name: 'engine_version' })
  engineVersion: string;

  @Column({ type: 'text', name: 'task_kind' })
  taskKind: string;

  @Column({ type: 'jsonb' })
  result: AnalyzeResult;

  @Column({ type: 'double precision', name: 'elapsed_ms' })
  elapsedMs: number;

  /** When the run finished. */
  @Column({ type: 'timestamptz', name: 'computed_at' })
  computedAt: Date;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
