import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { BillingLineInput } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { QuoteLine } from './quote-line.entity.js';
import { Quote } from './quote.entity.js';

export type AcceptedQuote = { id: number; number: string; lines: BillingLineInput[] };

/** A job's accepted quote, for invoices (in the caller's transaction when a manager is given). */
@Injectable()
export class AcceptedQuoteReader {
  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The job's accepted quote (the newest, should there be several) with its lines in order, or null. */
  async acceptedQuote(jobId: number, manager?: EntityManager): Promise<AcceptedQuote | null> {
    const m = manager ?? this.dataSource.manager;
    const quote = await m.findOne(Quote, { where: { jobId, status: 'accepted' }, order: { id: 'DESC' } });
    if (!quote) return null;
    const lines = await m.find(QuoteLine, { where: { quoteId: quote.id }, order: { position: 'ASC' } });
    return {
      id: quote.id,
      number: quote.number ?? '',
      lines: lines.map((l) => ({
        priceItemId: l.priceItemId,
        code: l.code,
        description: l.description,
        unit: l.unit,
        quantityMilli: l.quantityMilli,
        unitPriceMinor: l.unitPriceMinor,
      })),
    };
  }
}
