import { Column, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { DecisionRule, ExtraComponent } from '@kilocycle/common/types';

/** A calibration procedure: the method text, the decision rule and the budget defaults the lead sets. */
@Entity('procedures')
export class Procedure {
  @PrimaryGeneratedColumn()
  id: number;

  @Index('UQ_procedures_name', { unique: true })
  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'text' })
  method: string;

  @Column({ name: 'decision_rule', type: 'varchar', length: 16 })
  decisionRule: DecisionRule;

  @Column({ name: 'dial_half_division_pct', type: 'double' })
  dialHalfDivisionPercentOfSpan: number;

  @Column({ name: 'drift_ppm', type: 'double', default: 0 })
  driftPpm: number;

  @Column({ name: 'drift_hz', type: 'double', default: 0 })
  driftHz: number;

  @Column({ name: 'extra_components', type: 'json' })
  extraComponents: ExtraComponent[];

  @Column({ name: 'is_default', type: 'boolean', default: false })
  isDefault: boolean;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  /** Counter-assisted capture: N consecutive counter readings that must agree … */
  @Column({ name: 'capture_settle_count', type: 'int', default: 5 })
  captureSettleCount: number;

  /** … within this band (max − min), Hz … */
  @Column({ name: 'capture_tolerance_hz', type: 'double', default: 5 })
  captureToleranceHz: number;

  /** … before this many seconds pass. */
  @Column({ name: 'capture_timeout_s', type: 'int', default: 30 })
  captureTimeoutS: number;

  /** Dial marks in the order the procedure takes them (null: none listed). */
  @Column({ name: 'dial_marks', type: 'json', nullable: true })
  dialMarks: number[] | null;

  /** 1 when created, +1 at every edit; procedure_versions keeps each one. */
  @Column({ type: 'int', default: 1 })
  version: number;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
