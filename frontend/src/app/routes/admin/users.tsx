import { PageHeader } from '@/components/ui/page-header';
import { useOrganizations } from '@/features/organizations/api/get-organizations';
import { CreateUser } from '@/features/users/components/create-user';
import { UsersTable } from '@/features/users/components/users-table';
import { MAX_PAGE_SIZE } from '@kilocycle/common/types';

// The organisation list is composed in here so the users feature need not import the organisations feature.
const ALL_ORGANIZATIONS = { pageSize: MAX_PAGE_SIZE, sort: 'name' };

export default function UsersRoute() {
  const organizations = useOrganizations({ query: ALL_ORGANIZATIONS });
  const items = organizations.data?.items ?? [];
  return (
    <>
      <PageHeader
        title="Users"
        description="Everyone who can sign in: lab staff and the customers’ contacts. A deactivated account is refused at once."
        actions={<CreateUser organizations={items} organizationsLoading={organizations.isPending} />}
      />
      <UsersTable organizations={items} />
    </>
  );
}
