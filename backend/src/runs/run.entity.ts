import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { RunDataKind, RunKind, RunStatus } from '@kilocycle/common/types';
import { Bench } from '../benches/bench.entity.js';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { Job } from '../jobs/job.entity.js';
import { Standard } from '../standards/standard.entity.js';
import { User } from '../users/user.entity.js';

/** One sequence of readings on one range. */
@Entity('runs')
@Index('IDX_runs_job', ['jobId'])
@Index('IDX_runs_bench_status', ['benchId', 'status'])
export class Run {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'job_id', type: 'int' })
  jobId: number;

  @ManyToOne(() => Job, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'job_id', foreignKeyConstraintName: 'FK_runs_job' })
  job: Relation<Job>;

  @Column({ name: 'range_id', type: 'int' })
  rangeId: number;

  @ManyToOne(() => InstrumentRange, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'range_id', foreignKeyConstraintName: 'FK_runs_range' })
  range: Relation<InstrumentRange>;

  @Column({ type: 'varchar', length: 24 })
  kind: RunKind;

  /** What the readings' value column holds: frequency (Hz) or phase (time interval, s; stability runs only). Set when opened. */
  @Column({ name: 'data_kind', type: 'varchar', length: 12, default: 'frequency' })
  dataKind: RunDataKind;

  @Column({ type: 'varchar', length: 8, default: 'open' })
  status: RunStatus;

  @Column({ name: 'bench_id', type: 'int', nullable: true })
  benchId: number | null;

  @ManyToOne(() => Bench, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'bench_id', foreignKeyConstraintName: 'FK_runs_bench' })
  bench: Relation<Bench> | null;

  @Column({ name: 'standard_id', type: 'int', nullable: true })
  standardId: number | null;

  @ManyToOne(() => Standard, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'standard_id', foreignKeyConstraintName: 'FK_runs_standard' })
  standard: Relation<Standard> | null;

  /** The version of the standard the signed results used; set at signing (open jobs use the newest). */
  @Column({ name: 'standard_version', type: 'int', nullable: true })
  standardVersion: number | null;

  @Column({ name: 'standard_override_reason', type: 'text', nullable: true })
  standardOverrideReason: string | null;

  @Column({ name: 'supply_voltage', type: 'double', nullable: true })
  supplyVoltage: number | null;

  @Column({ type: 'text', nullable: true })
  configuration: string | null;

  @Column({ type: 'text', nullable: true })
  notes: string | null;

  @Column({ name: 'started_at', type: 'datetime', precision: 3 })
  startedAt: Date;

  @Column({ name: 'ended_at', type: 'datetime', precision: 3, nullable: true })
  endedAt: Date | null;

  @Column({ name: 'created_by', type: 'int' })
  createdById: number;

  // The counters below are kept by the readings write path (RunCountersWriter) in the batch's own transaction;
  // an entity save never writes them, so a run loaded before a batch cannot put back an older count.
  @Column({ name: 'reading_count', type: 'int', default: 0, insert: false, update: false })
  readingCount: number;

  @Column({ name: 'excluded_count', type: 'int', default: 0, insert: false, update: false })
  excludedCount: number;

  /** The highest seq stored in the run; 0 before its first reading. */
  @Column({ name: 'last_seq', type: 'int', default: 0, insert: false, update: false })
  lastSeq: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by', foreignKeyConstraintName: 'FK_runs_created_by' })
  createdBy: Relation<User>;
}
