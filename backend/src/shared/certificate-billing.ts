import type { EntityManager } from 'typeorm';
import type { CertificateRelease, Role } from '@kilocycle/common/types';

/**
 * What billing has to say about a certificate. Declared here and provided by InvoicesModule
 * (invoices/certificate-billing.provider.ts), so that certificates can ask without importing invoices, which
 * itself depends on certificates: the dependency points one way, invoices → certificates. Certificates injects
 * it as optional: with no provider registered nothing is billed and nothing is held.
 */
export const CERTIFICATE_BILLING = 'CERTIFICATE_BILLING';

export type CertificateBilling = {
  /** Called in the signing transaction: makes the job's draft invoice (from the accepted quote, else the proposed lines) unless it has one. */
  certificateIssued(jobId: number, manager: EntityManager): Promise<void>;
  /** Whether this user may download the job's certificate now, and if not why (staff always may). */
  releaseFor(user: { role: Role; organizationId: number }, jobId: number, manager?: EntityManager): Promise<CertificateRelease>;
  /** releaseFor for several jobs at once (a list page), keyed by job id. */
  releasesFor(user: { role: Role; organizationId: number }, jobIds: readonly number[], manager?: EntityManager): Promise<Map<number, CertificateRelease>>;
};
