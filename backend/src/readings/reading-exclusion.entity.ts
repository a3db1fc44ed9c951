import { Column, Entity, Index, JoinColumn, OneToOne, PrimaryColumn, type Relation } from 'typeorm';
import { Reading } from './reading.entity.js';

/** Marks a reading as excluded from analysis, with who, when and why. The reading itself stays as it was. */
@Entity('reading_exclusions')
export class ReadingExclusion {
  @PrimaryColumn({ name: 'reading_id', type: 'bigint' })
  readingId: string;

  @OneToOne(() => Reading, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'reading_id', foreignKeyConstraintName: 'FK_reading_exclusions_reading' })
  reading: Relation<Reading>;

  @Index('IDX_reading_exclusions_run')
  @Column({ name: 'run_id', type: 'int' })
  runId: number;

  @Column({ type: 'varchar', length: 500 })
  reason: string;

  @Column({ name: 'excluded_by', type: 'int' })
  excludedBy: number;

  @Column({ name: 'excluded_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  excludedAt: Date;
}
