import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { CertificatesModule } from '../certificates/certificates.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { MailModule } from '../mail/mail.module.js';
import { OrganizationsModule } from '../organizations/organizations.module.js';
import { PricesModule } from '../prices/prices.module.js';
import { CERTIFICATE_BILLING } from '../shared/certificate-billing.js';
import { StorageModule } from '../storage/storage.module.js';
import { CertificateBillingProvider } from './certificate-billing.provider.js';
import { CreditNote } from './credit-note.entity.js';
import { DocumentSequence } from './document-sequence.entity.js';
import { InvoiceLedger } from './invoice-ledger.writer.js';
import { InvoiceLine } from './invoice-line.entity.js';
import { InvoiceViews } from './invoice-views.js';
import { Invoice } from './invoice.entity.js';
import { CreditNotesController, InvoicesController, JobInvoiceController, StatementController } from './invoices.controller.js';
import { InvoicesService } from './invoices.service.js';
import { LedgerEntry } from './ledger-entry.entity.js';
import { OverdueRemindersService } from './overdue-reminders.service.js';
import { PayableInvoiceReader } from './payable-invoice.reader.js';
import { StatementsService } from './statements.service.js';

/**
 * Invoices and credit notes; owns invoices, invoice_lines, credit_notes, invoice_ledger_entries and
 * document_sequences. Global: certificates (which this module imports) asks CERTIFICATE_BILLING when a job is
 * signed and before a client downloads a certificate. Exports the ledger and the payable reader for payments.
 */
@Global()
@Module({
  imports: [
    TypeOrmModule.forFeature([Invoice, InvoiceLine, CreditNote, DocumentSequence, LedgerEntry]),
    JobsModule,
    OrganizationsModule,
    PricesModule,
    CertificatesModule,
    MailModule,
    StorageModule,
  ],
  controllers: [InvoicesController, CreditNotesController, JobInvoiceController, StatementController],
  providers: [
    InvoicesService,
    InvoiceViews,
    StatementsService,
    OverdueRemindersService,
    InvoiceLedger,
    PayableInvoiceReader,
    CertificateBillingProvider,
    { provide: CERTIFICATE_BILLING, useExisting: CertificateBillingProvider },
  ],
  exports: [InvoicesService, InvoiceLedger, PayableInvoiceReader, CERTIFICATE_BILLING],
})
export class InvoicesModule {}
