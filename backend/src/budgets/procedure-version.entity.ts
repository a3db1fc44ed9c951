import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ProcedureVersion as ProcedureVersionFigures } from '@kilocycle/common/types';
import { Procedure } from './procedure.entity.js';

/** Each version of a procedure as it stood: written when it is created and at every edit, never changed. */
@Entity('procedure_versions')
@Index('UQ_procedure_versions_procedure_version', ['procedureId', 'version'], { unique: true })
export class ProcedureVersionRow {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'procedure_id', type: 'int' })
  procedureId: number;

  @ManyToOne(() => Procedure, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'procedure_id', foreignKeyConstraintName: 'FK_procedure_versions_procedure' })
  procedure: Relation<Procedure>;

  @Column({ type: 'int' })
  version: number;

  @Column({ type: 'json' })
  figures: ProcedureVersionFigures;

  /** Null for versions the system wrote (the migration's first versions, the seed). */
  @Column({ name: 'created_by', type: 'int', nullable: true })
  createdById: number | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;
}
