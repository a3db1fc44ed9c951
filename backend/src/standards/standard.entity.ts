import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { StandardKind } from '@kilocycle/common/types';

/** A counter or frequency reference the lab measures with. */
@Entity('standards')
export class Standard {
  @PrimaryGeneratedColumn()
  id: number;

  @Index('UQ_standards_name', { unique: true })
  @Column({ type: 'varchar', length: 120 })
  name: string;

  @Column({ type: 'varchar', length: 16 })
  kind: StandardKind;

  @Column({ name: 'make_model', type: 'varchar', length: 160 })
  makeModel: string;

  @Column({ type: 'varchar', length: 120 })
  serial: string;

  @Column({ name: 'certificate_number', type: 'varchar', length: 120 })
  certificateNumber: string;

  @Column({ name: 'due_date', type: 'date' })
  dueDate: string;

  @Column({ name: 'timebase_accuracy_ppm', type: 'double' })
  timebaseAccuracyPpm: number;

  @Column({ name: 'resolution_hz', type: 'double' })
  resolutionHz: number;

  @Column({ name: 'calibration_u_ppm', type: 'double' })
  calibrationUPpm: number;

  @Column({ name: 'calibration_k', type: 'double', default: 2 })
  calibrationK: number;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  /** 1 when created, +1 at every edit; standard_versions keeps each one. */
  @Column({ type: 'int', default: 1 })
  version: number;
}
