import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { ReadingSource } from '@kilocycle/common/types';
import { Run } from '../runs/run.entity.js';

/**
 * One reading. Rows are never updated or deleted (a database trigger refuses it); a wrong reading is
 * excluded by a row in reading_exclusions. The hot write path is ReadingsWriter's multi-row INSERT IGNORE.
 */
@Entity('readings')
@Index('UQ_readings_run_seq', ['runId', 'seq'], { unique: true })
@Index('IDX_readings_run_frequency', ['runId', 'frequency'])
@Index('IDX_readings_run_t', ['runId', 't'])
export class Reading {
  @PrimaryGeneratedColumn({ type: 'bigint' })
  id: string;

  @Column({ name: 'run_id', type: 'int' })
  runId: number;

  @ManyToOne(() => Run, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'run_id', foreignKeyConstraintName: 'FK_readings_run' })
  run: Relation<Run>;

  @Column({ type: 'int' })
  seq: number;

  /** Seconds since the run started. */
  @Column({ name: 't_s', type: 'double' })
  t: number;

  @Column({ type: 'double', nullable: true })
  dial: number | null;

  /**
   * The reading's value in its run's data kind (runs.data_kind): frequency in Hz, or in a phase run the time
   * interval in seconds. One value column, not one per kind: a run holds one kind (a mixed run is refused),
   * and the ingest path's one INSERT shape stays the same for both.
   */
  @Column({ name: 'frequency_hz', type: 'double' })
  frequency: number;

  @Column({ type: 'double', nullable: true })
  aux: number | null;

  @Column({ type: 'varchar', length: 8 })
  source: ReadingSource;

  @Column({ name: 'received_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  receivedAt: Date;

  /**
   * Who entered it: the user who typed or imported it (source manual or import), else null. No foreign
   * key and no index, deliberately: either would cost every row of the ingest INSERT an index write, and
   * users and benches are deactivated, never deleted. Null for readings stored before authors were kept.
   */
  @Column({ name: 'entered_by', type: 'int', nullable: true })
  enteredBy: number | null;

  /** The bench whose bridge sent it (source bridge), else null. */
  @Column({ name: 'bench_id', type: 'int', nullable: true })
  benchId: number | null;
}
