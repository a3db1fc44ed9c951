import { ConflictException } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import type { BillingLineInput, CustomerTerms } from '@kilocycle/common/types';
import type { AuditService } from '../audit/audit.service.js';
import type { JobScope } from '../jobs/job-scope.reader.js';
import type { CustomerTermsReader } from '../prices/customer-terms.reader.js';
import type { ProposedLinesReader } from '../prices/proposed-lines.reader.js';
import type { AcceptedQuoteReader } from '../quotes/accepted-quote.reader.js';
import { InvoiceLine } from './invoice-line.entity.js';
import { priceLines, taxTreatment, totalsOf } from './invoice-lines.js';
import { Invoice } from './invoice.entity.js';

/** The owners' readers a draft is made from (in the caller's transaction). */
export type DraftSources = {
  terms: CustomerTermsReader;
  acceptedQuotes: AcceptedQuoteReader;
  proposed: ProposedLinesReader;
  audit: AuditService;
};

/**
 * Replaces an invoice's lines, priced at the customer's tax treatment as it stands (per-line rounding), and its
 * totals and terms; in the caller's transaction.
 */
export async function writeLines(manager: EntityManager, invoiceId: number, inputs: readonly BillingLineInput[], terms: CustomerTerms): Promise<Invoice> {
  const tax = taxTreatment(terms);
  const lines = priceLines(inputs, tax.taxRateBasisPoints);
  const totals = totalsOf(lines);
  await manager.delete(InvoiceLine, { invoiceId });
  if (lines.length > 0)
    await manager.insert(
      InvoiceLine,
      lines.map((l) => ({ ...l, invoiceId })),
    );
  await manager.update(
    Invoice,
    { id: invoiceId },
    { ...tax, paymentTerms: terms.paymentTerms, netDays: terms.netDays, netMinor: totals.netMinor, taxMinor: totals.taxMinor, grossMinor: totals.grossMinor },
  );
  return manager.findOneOrFail(Invoice, { where: { id: invoiceId } });
}

/**
 * The job's draft invoice: the accepted quote's lines, or the proposed lines when the job has none, priced with
 * the customer's tax treatment. Refuses (409) when the job already has an invoice. In the caller's transaction,
 * with its audit event.
 */
export async function makeDraft(
  manager: EntityManager,
  sources: DraftSources,
  job: JobScope,
  options: { actorId: number | null; currency: string; now?: Date },
): Promise<Invoice> {
  const existing = await manager.findOne(Invoice, { where: { jobId: job.id }, lock: { mode: 'pessimistic_write' } });
  if (existing) throw new ConflictException(`job ${job.number} already has an invoice (${existing.number ?? `draft ${existing.id}`})`);
  const [terms, accepted] = await Promise.all([sources.terms.termsFor(job.organizationId, manager), sources.acceptedQuotes.acceptedQuote(job.id, manager)]);
  const inputs = accepted ? accepted.lines : await sources.proposed.proposedLines(job.id, manager);
  const now = options.now ?? new Date();
  const id = (
    await manager.insert(Invoice, {
      jobId: job.id,
      organizationId: job.organizationId,
      quoteId: accepted?.id ?? null,
      status: 'draft',
      currency: options.currency,
      paymentTerms: terms.paymentTerms,
      createdAt: now,
      updatedAt: now,
    })
  ).identifiers[0]!.id as number;
  const invoice = await writeLines(manager, id, inputs, terms);
  await sources.audit.record(
    {
      actorId: options.actorId,
      entity: 'invoice',
      entityId: id,
      action: 'create',
      changes: { jobId: job.id, quote: accepted?.number ?? null, lines: inputs.length, grossMinor: invoice.grossMinor },
      at: options.now,
    },
    manager,
  );
  return invoice;
}
