import { BILLING_ROLES } from '@kilocycle/common/rules';
import { MAX_PAGE_SIZE } from '@kilocycle/common/types';
import { PageHeader } from '@/components/ui/page-header';
import { ExportInvoicesButton } from '@/features/invoices/components/export-invoices-button';
import { InvoicesTable } from '@/features/invoices/components/invoices-table';
import { useOrganizations } from '@/features/organizations/api/get-organizations';
import { useCurrentUser } from '@/lib/auth';

const ALL_ORGANIZATIONS = { pageSize: MAX_PAGE_SIZE, sort: 'name' };

export default function InvoicesRoute() {
  const user = useCurrentUser();
  const organizations = useOrganizations({ query: ALL_ORGANIZATIONS });
  const customers = (organizations.data?.items ?? []).filter((o) => o.kind === 'customer').map((o) => ({ value: String(o.id), label: o.name }));
  return (
    <>
      <PageHeader
        title="Invoices"
        description="Every invoice, from the draft made at signing to paid: its due date, what is owed, and the credit notes and card payments against it."
        actions={BILLING_ROLES.includes(user.role) ? <ExportInvoicesButton /> : undefined}
      />
      <InvoicesTable customers={customers} />
    </>
  );
}
