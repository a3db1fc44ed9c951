import { PageHeader } from '@/components/ui/page-header';
import { jobPath, verifyPath } from '@/config/paths';
import { CertificatesTable } from '@/features/certificates/components/certificates-table';
import { PayInvoiceButton } from '@/features/invoices/components/pay-invoice-button';
import { useCurrentUser } from '@/lib/auth';

export default function CertificatesRoute() {
  const user = useCurrentUser();
  return (
    <>
      <PageHeader
        title="Certificates"
        description={
          user.role === 'client'
            ? 'The certificates issued to your organisation. A superseded revision stays available beside the one that replaces it.'
            : 'Every certificate the lab has issued, with its revisions. An amendment opens a new revision; the old one stays, marked superseded.'
        }
      />
      <CertificatesTable
        verifyPath={verifyPath}
        jobPath={jobPath}
        payInvoice={user.role === 'client' ? (invoiceId) => <PayInvoiceButton invoiceId={invoiceId} label="Pay invoice" /> : undefined}
      />
    </>
  );
}
