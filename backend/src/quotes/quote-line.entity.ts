import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { PriceUnit } from '@kilocycle/common/types';
import { PriceItem } from '../prices/price-item.entity.js';
import { MoneyColumn } from '../shared/money-column.js';
import { Quote } from './quote.entity.js';

/** BIGINT read back as a number (mysql2 hands it over as text); quantities stay below MONEY_LIMITS.maxQuantityMilli. */
const WHOLE_NUMBER = { to: (value: number) => value, from: (value: string | number) => Number(value) };

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
  @Column({ name: 'quantity_milli', type: 'bigint', transformer: WHOLE_NUMBER })
  quantityMilli: number;

  @MoneyColumn('unit_price_minor')
  unitPriceMinor: number;

  @Column({ name: 'tax_rate_basis_points', type: 'int' })
  taxRateBasisPoints: number;

  @MoneyColumn('net_minor')
  netMinor: number;

  @MoneyColumn('tax_minor')
  taxMinor: number;

  @MoneyColumn('gross_minor')
  grossMinor: number;
}
