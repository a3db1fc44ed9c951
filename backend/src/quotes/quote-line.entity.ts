import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { PriceUnit } from '@kilocycle/common/types';
import { PriceItem } from '../prices/price-item.entity.js';
import { MINOR_UNITS } from '../shared/money-column.js';
import { Quote } from './quote.entity.js';

/** One line of a quote with its amounts, rounded per line (common/src/money/line-amounts.ts). */
@Entity('quote_lines')
@Index('UQ_quote_lines_position', ['quoteId', 'position'], { unique: true })
export class QuoteLine {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'quote_id', type: 'int' })
  quoteId: number;

  @ManyToOne(() => Quote, (quote) => quote.lines, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'quote_id', foreignKeyConstraintName: 'FK_quote_lines_quote' })
  quote: Relation<Quote>;

  /** 1, 2, … in the order printed. */
  @Column({ type: 'int' })
  position: number;

  /** The price list item the line came from, if any (the code and price are copied: the list may change later). */
  @Column({ name: 'price_item_id', type: 'int', nullable: true })
  priceItemId: number | null;

  @ManyToOne(() => PriceItem, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'price_item_id', foreignKeyConstraintName: 'FK_quote_lines_price_item' })
  priceItem: Relation<PriceItem> | null;

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
