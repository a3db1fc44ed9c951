import { Column, Entity, JoinColumn, OneToOne, PrimaryColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { ExtraComponent } from '@kilocycle/common/types';
import { Run } from '../runs/run.entity.js';

/** Per-run overrides of the procedure's budget figures; null keeps the default. */
@Entity('run_budgets')
export class RunBudget {
  @PrimaryColumn({ name: 'run_id', type: 'int' })
  runId: number;

  @OneToOne(() => Run, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'run_id', foreignKeyConstraintName: 'FK_run_budgets_run' })
  run: Relation<Run>;

  @Column({ name: 'dial_half_division', type: 'double', nullable: true })
  dialHalfDivision: number | null;

  @Column({ name: 'drift_ppm', type: 'double', nullable: true })
  driftPpm: number | null;

  @Column({ name: 'drift_hz', type: 'double', nullable: true })
  driftHz: number | null;

  @Column({ name: 'counter_resolution_hz', type: 'double', nullable: true })
  counterResolutionHz: number | null;

  @Column({ name: 'extra_components', type: 'json', nullable: true })
  extraComponents: ExtraComponent[] | null;

  @Column({ type: 'text', nullable: true })
  note: string | null;

  @Column({ name: 'updated_by', type: 'int', nullable: true })
  updatedById: number | null;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
