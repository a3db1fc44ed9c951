import { verifyPath } from '@/config/paths';
import { CertificatesTable } from '@/features/certificates/components/certificates-table';
import { PayInvoiceButton } from '@/features/invoices/components/pay-invoice-button';
import { WelcomePanel } from '@/features/overview/components/welcome-panel';
import { PortalOverview } from '@/features/portal/components/portal-overview';
import { useCurrentUser } from '@/lib/auth';

/** A held certificate's way out: the invoices feature's card payment. */
const payInvoice = (invoiceId: number) => <PayInvoiceButton invoiceId={invoiceId} label="Pay invoice" />;

export default function OverviewRoute() {
  const user = useCurrentUser();
  // A customer's overview is their own instruments, jobs and certificates.
  if (user.role === 'client')
    return <PortalOverview certificates={<CertificatesTable embedded verifyPath={verifyPath} payInvoice={payInvoice} />} payInvoice={payInvoice} />;
  return <WelcomePanel />;
}
