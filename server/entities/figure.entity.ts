import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { UserEntity } from './user.entity.ts';

/**
 * A plot of a cell output, rendered on the server to SVG and PNG and stored in file storage.
 * Linked to the revision whose output it shows and to that output's input hash, so the figure
 * can be traced to the exact model and settings that produced it.
 */
@Entity({ name: 'figure' })
export class FigureEntity {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'uuid', name: 'notebook_id' })
  notebookId: string;

  @Column({ type: 'uuid', name: 'entry_id' })
  entryId: string;

  @Column({ type: 'uuid', name: 'revision_id' })
  revisionId: string;

  @Column({ type: 'uuid', name: 'cell_id' })
  cellId: string;

  @Column({ type: 'text', name: 'cell_kind' })
  cellKind: string;

  /** sha256 of the resolved request behind the output (see shared/cells/hash.ts). */
  @Column({ type: 'text', name: 'input_hash' })
  inputHash: string;

  @Column({ type: 'text', name: 'engine_version' })
  engineVersion: string;

  @Column({ type: 'text' })
  caption: string;

  /** The vega-lite specification that was rendered. */
  @Column({ type: 'jsonb' })
  spec: object;

  @Column({ type: 'text', name: 'svg_key' })
  svgKey: string;

  @Column({ type: 'text', name: 'png_key' })
  pngKey: string;

  @Column({ type: 'text', name: 'svg_sha256' })
  svgSha256: string;

  @Column({ type: 'text', name: 'png_sha256' })
  pngSha256: string;

  @Column({ type: 'integer', name: 'png_width' })
  pngWidth: number;

  @Column({ type: 'integer', name: 'png_height' })
  pngHeight: number;

  @Column({ type: 'uuid', name: 'created_by_id' })
  createdById: string;

  @ManyToOne('UserEntity')
  @JoinColumn({ name: 'created_by_id' })
  createdBy: Relation<UserEntity>;

  @CreateDateColumn({ type: 'timestamptz', name: 'created_at' })
  createdAt: Date;
}
