import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { ComparableRunKind } from '@kilocycle/common/types';
import { Instrument } from '../instruments/instrument.entity.js';
import { User } from '../users/user.entity.js';

/** A saved comparison of two to six warm-up or stability runs of one instrument; the figures are computed when it is opened. */
@Entity('comparisons')
@Index('IDX_comparisons_instrument', ['instrumentId'])
export class Comparison {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 200 })
  title: string;

  @Column({ type: 'text', nullable: true })
  notes: string | null;

  @Column({ name: 'instrument_id', type: 'int' })
  instrumentId: number;

  @ManyToOne(() => Instrument, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'instrument_id', foreignKeyConstraintName: 'FK_comparisons_instrument' })
  instrument: Relation<Instrument>;

  @Column({ type: 'varchar', length: 16 })
  kind: ComparableRunKind;

  /** Run ids in display order; the first is the reference the others are compared with. */
  @Column({ name: 'run_ids', type: 'json' })
  runIds: number[];

  @Column({ type: 'json' })
  labels: string[];

  /** Settling band and drift window, as saved (null: the defaults). */
  @Column({ name: 'within_hz', type: 'double', nullable: true })
  withinHz: number | null;

  @Column({ name: 'window_seconds', type: 'double', nullable: true })
  windowSeconds: number | null;

  @Column({ name: 'created_by', type: 'int' })
  createdById: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_comparisons_created_by' })
  createdBy: Relation<User>;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
