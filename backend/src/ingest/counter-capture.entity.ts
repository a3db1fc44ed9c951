import { Column, Entity, Index, JoinColumn, ManyToOne, OneToOne, PrimaryColumn, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { Reading } from '../readings/reading.entity.js';
import { Run } from '../runs/run.entity.js';

/**
 * A dial setting taken with the counter's help: the stored reading for the setting (the mean of the
 * settled counter readings) with n, SD and the rule that settled it. Written once, when it settles, in the
 * same transaction as that reading and its links; settings abandoned or timed out leave no row.
 */
@Entity('counter_captures')
export class CounterCaptureRow {
  @PrimaryGeneratedColumn()
  id: number;

  @Index('IDX_counter_captures_run')
  @Column({ name: 'run_id', type: 'int' })
  runId: number;

  @ManyToOne(() => Run, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'run_id', foreignKeyConstraintName: 'FK_counter_captures_run' })
  run: Relation<Run>;

  /** The reading stored for the setting. */
  @Index('UQ_counter_captures_reading', { unique: true })
  @Column({ name: 'reading_id', type: 'bigint' })
  readingId: string;

  @ManyToOne(() => Reading, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'reading_id', foreignKeyConstraintName: 'FK_counter_captures_reading' })
  reading: Relation<Reading>;

  @Column({ type: 'double' })
  dial: number;

  @Column({ type: 'int' })
  n: number;

  @Column({ name: 'mean_hz', type: 'double' })
  meanHz: number;

  @Column({ name: 'sd_hz', type: 'double' })
  sdHz: number;

  @Column({ name: 'spread_hz', type: 'double' })
  spreadHz: number;

  @Column({ name: 'settle_count', type: 'int' })
  settleCount: number;

  @Column({ name: 'tolerance_hz', type: 'double' })
  toleranceHz: number;

  @Column({ name: 'started_at', type: 'datetime', precision: 3 })
  startedAt: Date;

  @Column({ name: 'settled_at', type: 'datetime', precision: 3 })
  settledAt: Date;

  @Column({ name: 'started_by', type: 'int' })
  startedBy: number;
}

/** The counter readings behind a settled setting (the last N, which agreed): the budget's repeatability uses them. */
@Entity('counter_capture_samples')
export class CounterCaptureSample {
  /** A counter reading belongs to one setting at most. */
  @PrimaryColumn({ name: 'reading_id', type: 'bigint' })
  readingId: string;

  @OneToOne(() => Reading, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'reading_id', foreignKeyConstraintName: 'FK_counter_capture_samples_reading' })
  reading: Relation<Reading>;

  @Index('IDX_counter_capture_samples_capture')
  @Column({ name: 'capture_id', type: 'int' })
  captureId: number;

  @ManyToOne(() => CounterCaptureRow, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'capture_id', foreignKeyConstraintName: 'FK_counter_capture_samples_capture' })
  capture: Relation<CounterCaptureRow>;
}
