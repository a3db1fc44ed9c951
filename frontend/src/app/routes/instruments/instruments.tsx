import { MAX_PAGE_SIZE } from '@kilocycle/common/types';
import { BENCH_ROLES } from '@kilocycle/common/rules';
import { PageHeader } from '@/components/ui/page-header';
import { CreateInstrument } from '@/features/instruments/components/instrument-form';
import { InstrumentsTable } from '@/features/instruments/components/instruments-table';
import { useOrganizations } from '@/features/organizations/api/get-organizations';
import { useCurrentUser } from '@/lib/auth';

const ALL_ORGANIZATIONS = { pageSize: MAX_PAGE_SIZE, sort: 'name' };

export default function InstrumentsRoute() {
  const user = useCurrentUser();
  const isClient = user.role === 'client';
  // A client sees only its own organisation's instruments, so it needs no owner filter.
  const organizations = useOrganizations({ query: ALL_ORGANIZATIONS, enabled: !isClient });
  const owners = (organizations.data?.items ?? []).filter((o) => o.active).map((o) => ({ value: String(o.id), label: o.name }));
  return (
    <>
      <PageHeader
        title="Instruments"
        description={
          isClient
            ? 'Your organisation’s instruments, with their ranges and when each is next due.'
            : 'Every unit the lab has seen: owner, identification, ranges and recall. Due dates within 30 days are flagged.'
        }
        actions={BENCH_ROLES.includes(user.role) ? <CreateInstrument owners={owners} /> : undefined}
      />
      <InstrumentsTable owners={isClient ? [] : owners} />
    </>
  );
}
