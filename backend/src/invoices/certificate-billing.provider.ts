import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { In, type DataSource, type EntityManager } from 'typeorm';
import type { CertificateRelease, Role } from '@kilocycle/common/types';
import { certificateRelease } from '@kilocycle/common/rules';
import { JobScopeReader } from '../jobs/job-scope.reader.js';
import type { CertificateBilling } from '../shared/certificate-billing.js';
import { makeDraft } from './invoice-drafts.js';
import { Invoice } from './invoice.entity.js';
import { InvoicesService } from './invoices.service.js';
import { labCurrency } from '../shared/currency.js';

type Asker = { role: Role; organizationId: number };

/**
 * The invoices module's side of CERTIFICATE_BILLING: a signed job gets its draft invoice in the signing
 * transaction, and a client's download of the certificate waits for the invoice to be paid unless the customer
 * is on account (common/src/rules/certificate-release.ts). Staff are never held.
 */
@Injectable()
export class CertificateBillingProvider implements CertificateBilling {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly jobs: JobScopeReader,
    private readonly invoices: InvoicesService,
  ) {}

  async certificateIssued(jobId: number, manager: EntityManager): Promise<void> {
    const job = await this.jobs.scope(jobId, manager, true);
    if (!job) return;
    // An amendment signs the job again: the invoice made at the first signing stands (corrections are credit notes).
    if (await manager.findOne(Invoice, { where: { jobId } })) return;
    await makeDraft(manager, this.invoices.sources, job, { actorId: null, currency: labCurrency() });
  }

  async releaseFor(user: Asker, jobId: number, manager?: EntityManager): Promise<CertificateRelease> {
    return (await this.releasesFor(user, [jobId], manager)).get(jobId)!;
  }

  async releasesFor(user: Asker, jobIds: readonly number[], manager?: EntityManager): Promise<Map<number, CertificateRelease>> {
    const released: CertificateRelease = { released: true, heldReason: null, invoiceId: null };
    const result = new Map<number, CertificateRelease>();
    if (jobIds.length === 0) return result;
    if (user.role !== 'client') {
      for (const id of jobIds) result.set(id, released);
      return result;
    }
    const m = manager ?? this.dataSource.manager;
    const terms = await this.invoices.sources.terms.termsFor(user.organizationId, m);
    const rows = await m.find(Invoice, { where: { jobId: In([...new Set(jobIds)]) } });
    for (const id of jobIds) {
      const row = rows.find((r) => r.jobId === id);
      // The customer's terms as they stand: a customer the lab moves onto account gets its held certificates at once.
      const invoice = row ? { id: row.id, status: row.status, number: row.number } : null;
      result.set(id, certificateRelease({ role: user.role, paymentTerms: terms.paymentTerms, invoice }));
    }
    return result;
  }
}
