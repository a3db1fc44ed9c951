import { PageHeader } from '@/components/ui/page-header';
import { PortalInvoices } from '@/features/invoices/components/portal-invoices';

export default function PortalInvoicesRoute() {
  return (
    <>
      <PageHeader
        title="Invoices"
        description="Your account with the lab and its invoices. Pay one by card here; a certificate held for payment is released as soon as its invoice is paid."
      />
      <PortalInvoices />
    </>
  );
}
