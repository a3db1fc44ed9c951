import { PageHeader } from '@/components/ui/page-header';
import { StandardsTable } from '@/features/standards/components/standards-table';
import { useCurrentUser } from '@/lib/auth';

export default function StandardsRoute() {
  const user = useCurrentUser();
  return (
    <>
      <PageHeader
        title="Reference standards"
        description="The counters and references the lab measures with. A standard past its due date cannot be used in a new run unless a lead overrides it with a written reason."
      />
      <StandardsTable canEdit={user.role === 'lead' || user.role === 'admin'} />
    </>
  );
}
