import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { JobsModule } from '../jobs/jobs.module.js';
import { PricesModule } from '../prices/prices.module.js';
import { JOB_START_GATE } from '../shared/job-start-gate.js';
import { AcceptedQuoteReader } from './accepted-quote.reader.js';
import { QuoteLine } from './quote-line.entity.js';
import { QuoteStartGate } from './quote-start-gate.js';
import { Quote } from './quote.entity.js';

/**
 * Quotes of jobs; owns quotes and quote_lines. Global: jobs (which this module imports) asks the job start gate
 * (JOB_START_GATE, declared in shared/) before work starts, which this module provides (quotes → jobs, one way).
 */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([Quote, QuoteLine]), JobsModule, PricesModule],
  providers: [AcceptedQuoteReader, QuoteStartGate, { provide: JOB_START_GATE, useExisting: QuoteStartGate }],
  exports: [AcceptedQuoteReader, JOB_START_GATE],
})
export class QuotesModule {}
