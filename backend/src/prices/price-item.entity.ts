import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { PriceUnit } from '@kilocycle/common/types';
import { MoneyColumn } from '../shared/money-column.js';

/** One service on the lab's price list: its own code, what it is, how it is counted and what one unit costs. */
@Entity('price_items')
export class PriceItem {
  @PrimaryGeneratedColumn()
  id: number;

  @Index('UQ_price_items_code', { unique: true })
  @Column({ type: 'varchar', length: 32 })
  code: string;

  @Column({ type: 'varchar', length: 500 })
  description: string;

  @Column({ type: 'varchar', length: 16 })
  unit: PriceUnit;

  @MoneyColumn('unit_price_minor')
  unitPriceMinor: number;

  /** Proposed on every new quote (see prices/proposed-lines.reader.ts). */
  @Column({ name: 'propose_on_quotes', type: 'boolean', default: false })
  proposeOnQuotes: boolean;

  /** An item taken off the list stays for the documents that name it. */
  @Column({ type: 'boolean', default: true })
  active: boolean;

  @CreateDateColumn({ name: 'created_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'datetime', precision: 3, default: () => 'CURRENT_TIMESTAMP(3)', onUpdate: 'CURRENT_TIMESTAMP(3)' })
  updatedAt: Date;
}
