import { PageHeader } from '@/components/ui/page-header';
import { CreateOrganization } from '@/features/organizations/components/create-organization';
import { OrganizationsTable } from '@/features/organizations/components/organizations-table';

export default function OrganisationsRoute() {
  return (
    <>
      <PageHeader
        title="Organisations"
        description="The lab itself and the customers whose instruments it calibrates. A client account belongs to one customer."
        actions={<CreateOrganization />}
      />
      <OrganizationsTable />
    </>
  );
}
