import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn, type Relation } from 'typeorm';
import { Organization } from '../organizations/organization.entity.js';
import { InstrumentRange } from './instrument-range.entity.js';

@Entity('instruments')
@Index('IDX_instruments_organization', ['organizationId'])
@Index('UQ_instruments_make_model_serial', ['make', 'model', 'serial'], { unique: true })
export class Instrument {
  @PrimaryGeneratedColumn()
  id: number;

  /** The owner: a customer organisation (or the lab, for its own equipment). */
  @Column({ name: 'organization_id', type: 'int' })
  organizationId: number;

  @ManyToOne(() => Organization, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'organization_id', foreignKeyConstraintName: 'FK_instruments_organization' })
  organization: Relation<Organization>;

  @Column({ type: 'varchar', length: 120 })
  make: string;

  @Column({ type: 'varchar', length: 120 })
  model: string;

  @Column({ type: 'varchar', length: 120 })
  serial: string;

  @Column({ name: 'asset_tag', type: 'varchar', length: 120, nullable: true })
  assetTag: string | null;

  @Column({ type: 'text', nullable: true })
  description: string | null;

  @Column({ name: 'recall_interval_months', type: 'int', default: 12 })
  recallIntervalMonths: number;

  @Index('IDX_instruments_next_due')
  @Column({ name: 'next_due_date', type: 'date', nullable: true })
  nextDueDate: string | null;

  @OneToMany(() => InstrumentRange, (range) => range.instrument)
  ranges: Relation<InstrumentRange[]>;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
