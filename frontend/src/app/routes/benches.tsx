import Box from '@mui/material/Box';
import { PageHeader } from '@/components/ui/page-header';
import { CreateBench } from '@/features/benches/components/create-bench';
import { BenchesTable } from '@/features/benches/components/benches-table';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { useStandards } from '@/lib/get-standards';
import { useCurrentUser } from '@/lib/auth';
import { formatDate } from '@/utils/format';

export default function BenchesRoute() {
  const user = useCurrentUser();
  const isAdmin = user.role === 'admin';
  const standards = useStandards({ query: { active: true, pageSize: 200, sort: 'name' }, enabled: isAdmin });
  const standardOptions = (standards.data?.items ?? []).map((s) => ({
    value: String(s.id),
    label: `${s.name} (due ${formatDate(s.dueDate)}${s.overdue ? ', overdue' : ''})`,
  }));
  return (
    <>
      <PageHeader
        title="Benches"
        description="Measurement stations. A bench’s bridge streams its counter into the run it is given; an administrator issues the bridge token, which is shown once."
        actions={isAdmin ? <CreateBench standards={standardOptions} /> : undefined}
      />
      <Box sx={{ mb: 2 }}>
        <SafetyCaution compact>A bench joins a counter to the equipment under test, often a live valve set.</SafetyCaution>
      </Box>
      <BenchesTable isAdmin={isAdmin} />
    </>
  );
}
