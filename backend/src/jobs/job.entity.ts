import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import type { JobStatus } from '@kilocycle/common/types';
import { Instrument } from '../instruments/instrument.entity.js';
import { Organization } from '../organizations/organization.entity.js';
import { User } from '../users/user.entity.js';

/** One instrument's visit to the lab. */
@Entity('jobs')
@Index('IDX_jobs_organization_status', ['organizationId', 'status'])
export class Job {
  @PrimaryGeneratedColumn()
  id: number;

  @Index('UQ_jobs_number', { unique: true })
  @Column({ type: 'varchar', length: 32 })
  number: string;

  @Column({ name: 'instrument_id', type: 'int' })
  instrumentId: number;

  @ManyToOne(() => Instrument, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'instrument_id', foreignKeyConstraintName: 'FK_jobs_instrument' })
  instrument: Relation<Instrument>;

  /** The customer: copied from the instrument's owner when the job is opened, for scoping. */
  @Column({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_jobs_organization' })
  organization: Relation<Organization>;

  @Column({ type: 'varchar', length: 16 })
  status: JobStatus;

  @Column({ name: 'received_date', type: 'date' })
  receivedDate: string;

  @Column({ name: 'condition_received', type: 'text', nullable: true })
  conditionReceived: string | null;

  @Column({ name: 'technician_id', type: 'int', nullable: true })
  technicianId: number | null;

  @ManyToOne(() => User, { onDelete: 'SET NULL', nullable: true })
  @JoinColumn({ name: 'technician_id', foreignKeyConstraintName: 'FK_jobs_technician' })
  technician: Relation<User> | null;

  @Column({ name: 'ambient_temp_c', type: 'double', nullable: true })
  ambientTempC: number | null;

  @Column({ name: 'humidity_pct', type: 'double', nullable: true })
  humidityPct: number | null;

  @Column({ type: 'text', nullable: true })
  notes: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
