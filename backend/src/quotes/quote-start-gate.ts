import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { CustomerTermsReader } from '../prices/customer-terms.reader.js';
import type { JobStartGate } from '../shared/job-start-gate.js';
import { Quote } from './quote.entity.js';
import { effectiveStatus } from './quote-status.js';

/**
 * The job start gate (shared/job-start-gate.ts) as quotes answer it: work on a job of a customer whose terms
 * require a quote waits until a quote of that job is accepted. Customers without that term are never held.
 */
@Injectable()
export class QuoteStartGate implements JobStartGate {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jobs: JobScopeReader,
    private readonly terms: CustomerTermsReader,
  ) {}

  async startRefusal(jobId: number, manager?: EntityManager): Promise<string | null> {
    const m = manager ?? this.dataSource.manager;
    const job = await this.jobs.scope(jobId, m);
    if (!job) return null;
    const terms = await this.terms.termsFor(job.organizationId, m);
    if (!terms.requiresQuote) return null;
    const quotes = await m.find(Quote, { where: { jobId }, order: { id: 'DESC' } });
    if (quotes.some((q) => q.status === 'accepted')) return null;
    const latest = quotes[0];
    if (!latest) return `work on this job waits for a quote: ${terms.organizationName} accepts a quote before work starts, and none has been made yet`;
    const status = effectiveStatus(latest, new Date());
    return `work on this job waits for the customer to accept quote ${latest.number ?? ''} (${status})`;
  }
}
