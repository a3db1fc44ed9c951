import { useState } from 'react';
import { BENCH_ROLES } from '@kilocycle/common/rules';
import { MAX_PAGE_SIZE } from '@kilocycle/common/types';
import { PageHeader } from '@/components/ui/page-header';
import { useInstruments } from '@/features/instruments/api/get-instruments';
import { CreateJob } from '@/features/jobs/components/create-job';
import { JobsTable } from '@/features/jobs/components/jobs-table';
import { useOrganizations } from '@/features/organizations/api/get-organizations';
import { useUsers } from '@/features/users/api/get-users';
import { useDebouncedValue } from '@/hooks/use-debounced-value';
import { useCurrentUser } from '@/lib/auth';

const ALL_ORGANIZATIONS = { pageSize: MAX_PAGE_SIZE, sort: 'name' };

export default function JobsRoute() {
  const user = useCurrentUser();
  const isClient = user.role === 'client';
  const canCreate = BENCH_ROLES.includes(user.role);
  const [instrumentSearch, setInstrumentSearch] = useState('');
  const q = useDebouncedValue(instrumentSearch.trim(), 250);
  const instruments = useInstruments({ query: { q: q || undefined, pageSize: 50, sort: 'make' }, enabled: canCreate });
  const technicians = useUsers({ query: { role: 'technician', active: true, pageSize: 100, sort: 'name' } });
  const organizations = useOrganizations({ query: ALL_ORGANIZATIONS, enabled: !isClient });
  const customers = (organizations.data?.items ?? []).filter((o) => o.kind === 'customer').map((o) => ({ value: String(o.id), label: o.name }));

  return (
    <>
      <PageHeader
        title="Jobs"
        description={
          isClient
            ? 'Where each of your instruments stands in the lab.'
            : 'Each instrument’s visit to the lab: received, at the bench, in review, approved and issued.'
        }
        actions={
          canCreate ? (
            <CreateJob
              instruments={(instruments.data?.items ?? []).map((i) => ({
                value: String(i.id),
                label: `${i.make} ${i.model} s/n ${i.serial} — ${i.organizationName}`,
              }))}
              instrumentsLoading={instruments.isFetching}
              onInstrumentSearch={setInstrumentSearch}
              technicians={(technicians.data?.items ?? []).map((t) => ({ value: String(t.id), label: t.name }))}
              defaultTechnicianId={user.role === 'technician' ? user.id : undefined}
            />
          ) : undefined
        }
      />
      <JobsTable customers={customers} />
    </>
  );
}
