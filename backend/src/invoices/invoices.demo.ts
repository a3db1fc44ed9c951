import type { DataSource, EntityManager } from 'typeorm';
import type { BillingLineInput } from '@kilocycle/common/types';
import { invoiceBalance } from '@kilocycle/common/money';
import { AuditService } from '../audit/audit.service.js';
import { CertificateSettingsReader } from '../certificates/certificate-settings.reader.js';
import { loadConfig } from '../config/config.module.js';
import { BillingInstrumentsReader } from '../instruments/billing-instruments.reader.js';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import { MailService } from '../mail/mail.service.js';
import { OrganizationsReader } from '../organizations/organizations.reader.js';
import { CustomerTermsReader } from '../prices/customer-terms.reader.js';
import { ProposedLinesReader } from '../prices/proposed-lines.reader.js';
import { AcceptedQuoteReader } from '../quotes/accepted-quote.reader.js';
import { BillingRunsReader } from '../runs/billing-runs.reader.js';
import { FileStore } from '../storage/file-store.service.js';
import { CertificateRecipientsReader } from '../users/certificate-recipients.reader.js';
import { makeDraft, writeLines } from './invoice-drafts.js';
import { InvoiceLedger } from './invoice-ledger.writer.js';
import { InvoiceViews } from './invoice-views.js';
import { Invoice } from './invoice.entity.js';
import { InvoicesService } from './invoices.service.js';

/** The invoices service and ledger over one data source, for code run outside Nest (the demo seed; it never mails). */
export function invoicesOver(dataSource: DataSource): { invoices: InvoicesService; ledger: InvoiceLedger } {
  const organizations = new OrganizationsReader(dataSource);
  const jobs = new JobScopeReader(dataSource);
  const people = new CertificateRecipientsReader(dataSource);
  const audit = AuditService.within(dataSource.manager);
  const invoices = new InvoicesService(
    dataSource,
    loadConfig(),
    audit,
    jobs,
    organizations,
    people,
    new InvoiceViews(dataSource, jobs, organizations, people),
    new FileStore(dataSource),
    new MailService(dataSource, audit),
    new CertificateSettingsReader(dataSource),
    new CustomerTermsReader(dataSource, organizations),
    new AcceptedQuoteReader(dataSource),
    new ProposedLinesReader(dataSource, jobs, new BillingInstrumentsReader(dataSource), new BillingRunsReader(dataSource)),
  );
  return { invoices, ledger: new InvoiceLedger(invoices, audit) };
}

export type DemoInvoiceStep =
  | { kind: 'issue'; at: Date }
  | { kind: 'payment'; amountMinor: number | 'balance'; at: Date }
  | { kind: 'credit'; amountMinor: number | 'balance'; reason: string; at: Date };

/**
 * One demo invoice for a job: the draft (from the job's accepted quote or proposed lines; `lines` when given, or
 * `linesWhenNone` when those give none),
 * then the steps in order through the same code as the API (issue with the next number, ledger payments, credit
 * notes). Part of the seed's one transaction; numbers follow the order of the calls.
 */
export async function seedDemoInvoice(
  manager: EntityManager,
  input: { jobId: number; createdAt: Date; lines?: BillingLineInput[]; linesWhenNone?: BillingLineInput[]; actorId: number; steps: DemoInvoiceStep[] },
): Promise<Invoice> {
  const { invoices, ledger } = invoicesOver(manager.connection);
  const job = await new JobScopeReader(manager.connection).scope(input.jobId, manager);
  if (!job) throw new Error(`demo invoice: job ${input.jobId} is missing`);
  let invoice = await makeDraft(manager, invoices.sources, job, { actorId: input.actorId, currency: invoices.currency, now: input.createdAt });
  const lines = input.lines ?? (invoice.grossMinor === 0 && input.linesWhenNone ? input.linesWhenNone : null);
  if (lines) invoice = await writeLines(manager, invoice.id, lines, await invoices.sources.terms.termsFor(job.organizationId, manager));
  for (const step of input.steps) {
    const row = await manager.findOneByOrFail(Invoice, { id: invoice.id });
    const amount = (value: number | 'balance') => (value === 'balance' ? invoiceBalance(row) : value);
    if (step.kind === 'issue') await invoices.issueWithin(manager, invoice.id, input.actorId, step.at);
    else if (step.kind === 'payment') await ledger.recordPayment(invoice.id, amount(step.amountMinor), row.currency, manager, { at: step.at });
    else
      await invoices.credit(manager, row, {
        amountMinor: amount(step.amountMinor),
        reason: step.reason,
        paymentId: null,
        actorId: input.actorId,
        now: step.at,
      });
  }
  return manager.findOneByOrFail(Invoice, { id: invoice.id });
}
