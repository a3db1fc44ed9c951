import { Injectable, NotFoundException } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { billableHoursMilli } from '@kilocycle/common/money';
import type { BillingLineInput, PriceUnit } from '@kilocycle/common/types';
import type { DataSource, EntityManager } from 'typeorm';
import { BillingInstrumentsReader } from '../instruments/billing-instruments.reader.js';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { BillingRunsReader } from '../runs/billing-runs.reader.js';
import { PriceItem } from './price-item.entity.js';

/**
 * The lines a new quote (or an invoice without an accepted quote) starts from: every active price item marked
 * "propose on quotes", in code order, counted for the job —
 *   per range: the number of ranges of the job's instrument (at least 1);
 *   per hour:  the time the job's study runs recorded, rounded up to the quarter hour, at least 1 h
 *              (common/src/money/billable-hours.ts);
 *   per job:   1.
 * Quantities are thousandths; prices are copied from the list as it stands now.
 */
@Injectable()
export class ProposedLinesReader {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jobs: JobScopeReader,
    private readonly instruments: BillingInstrumentsReader,
    private readonly runs: BillingRunsReader,
  ) {}

  /** The proposed lines for the job (in the caller's transaction when a manager is given); 404 for no such job. */
  async proposedLines(jobId: number, manager?: EntityManager): Promise<BillingLineInput[]> {
    const m = manager ?? this.dataSource.manager;
    const job = await this.jobs.scope(jobId, m);
    if (!job) throw new NotFoundException(`Job ${jobId} not found`);
    const items = await m.find(PriceItem, { where: { active: true, proposeOnQuotes: true }, order: { code: 'ASC' } });
    if (items.length === 0) return [];
    const units = new Set(items.map((i) => i.unit));
    const quantities: Record<PriceUnit, number> = { per_job: 1000, per_range: 1000, per_hour: 1000 };
    if (units.has('per_range')) quantities.per_range = Math.max(1, await this.instruments.rangeCount(job.instrumentId, m)) * 1000;
    if (units.has('per_hour')) quantities.per_hour = billableHoursMilli(await this.runs.studySeconds(jobId, m));
    return items.map((item) => ({
      priceItemId: item.id,
      code: item.code,
      description: item.description,
      unit: item.unit,
      quantityMilli: quantities[item.unit],
      unitPriceMinor: item.unitPriceMinor,
    }));
  }
}
