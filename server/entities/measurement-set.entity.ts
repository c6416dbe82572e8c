import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { MeasurementRow } from '@shared/api/measurements.ts';
import type { UserEntity } from './user.entity.ts';

/** Observed data imported from a CSV: parameter values, the observed state, optional error bars. */
@Entity({ name: 'measurement_set' })
export class MeasurementSetEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'notebook_id' })
  notebookId: string;

  @Column({ type: 'uuid', name: 'entry_id' })
  entryId: string;

  @Column({ type: 'text' })
  name: string;

  /** Column header of the parameter (e.g. "mu"). */
  @Column({ type: 'text', name: 'parameter_name' })
  parameterName: string;

  /** Column header of the observed state (e.g. "x"). */
  @Column({ type: 'text', name: 'state_name' })
  stateName: string;

  @Column({ type: 'jsonb' })
  rows: MeasurementRow[];

  @Column({ type: 'text' })
  sha256: string;

  @Column({ type: 'uuid', name: 'created_by_id' })
  createdById: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'created_by_id' })
  createdBy: Relation<UserEntity>;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
