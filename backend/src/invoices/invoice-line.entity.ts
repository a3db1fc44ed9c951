import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { PriceUnit } from '@kilocycle/common/types';
import { MINOR_UNITS } from '../shared/money-column.js';
import { Invoice } from './invoice.entity.js';

/** One line of an invoice with its amounts, rounded per line (common/src/money/line-amounts.ts). */
@Entity('invoice_lines')
@Index('UQ_invoice_lines_position', ['invoiceId', 'position'], { unique: true })
export class InvoiceLine {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'invoice_id', type: 'int' })
  invoiceId: number;

  @ManyToOne(() => Invoice, (invoice) => invoice.lines, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'invoice_id', foreignKeyConstraintName: 'FK_invoice_lines_invoice' })
  invoice: Relation<Invoice>;

  /** 1, 2, … in the order printed. */
  @Column({ type: 'int' })
  position: number;

  /** The price list item the line came from, if any (code and price are copied: the list may change later). */
  @Column({ name: 'price_item_id', type: 'int', nullable: true })
  priceItemId: number | null;

  @Column({ type: 'varchar', length: 32, nullable: true })
  code: string | null;

  @Column({ type: 'varchar', length: 500 })
  description: string;

  @Column({ type: 'varchar', length: 16 })
  unit: PriceUnit;

  /** Thousandths (1.5 h = 1500). */
  @Column({ name: 'quantity_milli', type: 'bigint', transformer: MINOR_UNITS })
  quantityMilli: number;

  @Column({ name: 'unit_price_minor', type: 'bigint', transformer: MINOR_UNITS })
  unitPriceMinor: number;

  @Column({ name: 'tax_rate_basis_points', type: 'int' })
  taxRateBasisPoints: number;

  @Column({ name: 'net_minor', type: 'bigint', transformer: MINOR_UNITS })
  netMinor: number;

  @Column({ name: 'tax_minor', type: 'bigint', transformer: MINOR_UNITS })
  taxMinor: number;

  @Column({ name: 'gross_minor', type: 'bigint', transformer: MINOR_UNITS })
  grossMinor: number;
}
