import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { StandardVersion as StandardVersionFigures } from '@kilocycle/common/types';
import { Standard } from './standard.entity.js';

/** Each version of a reference standard as it stood: written when it is created and at every edit, never changed. */
@Entity('standard_versions')
@Index('UQ_standard_versions_standard_version', ['standardId', 'version'], { unique: true })
export class StandardVersionRow {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'standard_id', type: 'int' })
  standardId: number;

  @ManyToOne(() => Standard, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'standard_id', foreignKeyConstraintName: 'FK_standard_versions_standard' })
  standard: Relation<Standard>;

  @Column({ type: 'int' })
  version: number;

  @Column({ type: 'json' })
  figures: StandardVersionFigures;

  /** Null for versions the system wrote (the migration's first versions, the seed). */
  @Column({ name: 'created_by', type: 'int', nullable: true })
  createdById: number | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;
}
