import { PageHeader } from '@/components/ui/page-header';
import { ProceduresTable } from '@/features/reviews/components/procedures-table';
import { useCurrentUser } from '@/lib/auth';

export default function ProceduresRoute() {
  const user = useCurrentUser();
  return (
    <>
      <PageHeader
        title="Procedures"
        description="Each procedure names its method and decision rule, and the uncertainty budget figures a run starts from. A run may override them until its job is signed."
      />
      <ProceduresTable canEdit={user.role === 'lead' || user.role === 'admin'} />
    </>
  );
}
