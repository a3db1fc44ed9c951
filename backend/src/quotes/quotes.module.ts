import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { JobsModule } from '../jobs/jobs.module.js';
import { OrganizationsModule } from '../organizations/organizations.module.js';
import { PricesModule } from '../prices/prices.module.js';
import { JOB_START_GATE } from '../shared/job-start-gate.js';
import { StorageModule } from '../storage/storage.module.js';
import { AcceptedQuoteReader } from './accepted-quote.reader.js';
import { QuoteLine } from './quote-line.entity.js';
import { QuoteStartGate } from './quote-start-gate.js';
import { Quote } from './quote.entity.js';
import { JobQuotesController, QuotesController } from './quotes.controller.js';
import { QuotesService } from './quotes.service.js';

/**
 * Quotes of jobs; owns quotes and quote_lines. Global: jobs (which this module imports) asks the job start gate
 * (JOB_START_GATE, declared in shared/) before work starts, which this module provides (quotes → jobs, one way).
 * Mail, audit and the certificate settings (the lab's address on the PDF) come from global modules.
 */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([Quote, QuoteLine]), JobsModule, PricesModule, OrganizationsModule, StorageModule],
  controllers: [QuotesController, JobQuotesController],
  providers: [QuotesService, AcceptedQuoteReader, QuoteStartGate, { provide: JOB_START_GATE, useExisting: QuoteStartGate }],
  exports: [QuotesService, AcceptedQuoteReader, JOB_START_GATE],
})
export class QuotesModule {}
