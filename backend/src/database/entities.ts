import { Attachment } from '../attachments/attachment.entity.js';
import { AuditEvent } from '../audit/audit-event.entity.js';
import { RevokedToken } from '../auth/revoked-token.entity.js';
import { Bench } from '../benches/bench.entity.js';
import { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { Instrument } from '../instruments/instrument.entity.js';
import { CounterCaptureRow, CounterCaptureSample } from '../ingest/counter-capture.entity.js';
import { Job } from '../jobs/job.entity.js';
import { JobProcedure } from '../budgets/job-procedure.entity.js';
import { Procedure } from '../budgets/procedure.entity.js';
import { ProcedureVersionRow } from '../budgets/procedure-version.entity.js';
import { RunBudget } from '../budgets/run-budget.entity.js';
import { Certificate } from '../certificates/certificate.entity.js';
import { Comparison } from '../comparisons/comparison.entity.js';
import { Setting } from '../certificates/setting.entity.js';
import { MailMessage } from '../mail/mail-message.entity.js';
import { RecallNotice } from '../recall/recall-notice.entity.js';
import { JobReview } from '../reviews/job-review.entity.js';
import { Organization } from '../organizations/organization.entity.js';
import { CustomerTermsRow } from '../prices/customer-terms.entity.js';
import { PriceItem } from '../prices/price-item.entity.js';
import { TaxRate } from '../prices/tax-rate.entity.js';
import { QuoteLine } from '../quotes/quote-line.entity.js';
import { Quote } from '../quotes/quote.entity.js';
import { ReadingExclusion } from '../readings/reading-exclusion.entity.js';
import { Reading } from '../readings/reading.entity.js';
import { Run } from '../runs/run.entity.js';
import { Standard } from '../standards/standard.entity.js';
import { StoredFile } from '../storage/stored-file.entity.js';
import { StandardVersionRow } from '../standards/standard-version.entity.js';
import { User } from '../users/user.entity.js';
import { CreditNote } from '../invoices/credit-note.entity.js';
import { DocumentSequence } from '../invoices/document-sequence.entity.js';
import { InvoiceLine } from '../invoices/invoice-line.entity.js';
import { Invoice } from '../invoices/invoice.entity.js';
import { LedgerEntry } from '../invoices/ledger-entry.entity.js';
import { PaymentEvent } from '../payments/payment-event.entity.js';
import { Payment } from '../payments/payment.entity.js';

/**
 * Every entity, for the stand-alone data source (CLI, seed, benchmarks). Nest modules register their
 * own with forFeature and autoLoadEntities; this list exists only for code that runs outside Nest.
 */
export const ENTITIES = [
  Organization,
  User,
  AuditEvent,
  RevokedToken,
  Instrument,
  InstrumentRange,
  Standard,
  Bench,
  Job,
  Run,
  Reading,
  ReadingExclusion,
  StandardVersionRow,
  Procedure,
  ProcedureVersionRow,
  JobProcedure,
  RunBudget,
  JobReview,
  Setting,
  StoredFile,
  Certificate,
  MailMessage,
  RecallNotice,
  Comparison,
  Attachment,
  CounterCaptureRow,
  CounterCaptureSample,
  PriceItem,
  TaxRate,
  CustomerTermsRow,
  Quote,
  QuoteLine,
  Invoice,
  InvoiceLine,
  CreditNote,
  DocumentSequence,
  LedgerEntry,
  Payment,
  PaymentEvent,
];
