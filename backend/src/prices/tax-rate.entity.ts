import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';

/** A tax rate the lab charges, in basis points (20 % = 2000). A rate in use is retired (inactive), never removed. */
@Entity('tax_rates')
export class TaxRate {
  @PrimaryGeneratedColumn()
  id: number;

  @Index('UQ_tax_rates_name', { unique: true })
  @Column({ type: 'varchar', length: 100 })
  name: string;

  @Column({ name: 'rate_basis_points', type: 'int' })
  rateBasisPoints: number;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
