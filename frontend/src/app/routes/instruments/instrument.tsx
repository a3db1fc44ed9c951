import ArrowBack from '@mui/icons-material/ArrowBack';
import TravelExploreOutlined from '@mui/icons-material/TravelExploreOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { Link as RouterLink, useParams } from 'react-router-dom';
import { BENCH_ROLES } from '@kilocycle/common/rules';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { PageHeader } from '@/components/ui/page-header';
import { bandPlanPath, paths } from '@/config/paths';
import { AttachmentsPanel } from '@/features/attachments/components/attachments-panel';
import { useInstrument } from '@/features/instruments/api/get-instrument';
import { EditInstrument } from '@/features/instruments/components/instrument-form';
import { InstrumentSummary } from '@/features/instruments/components/instrument-summary';
import { RangesEditor } from '@/features/instruments/components/ranges-editor';
import { useJobs } from '@/features/jobs/api/get-jobs';
import { JobsList } from '@/features/jobs/components/jobs-list';
import { useRuns } from '@/features/runs/api/get-runs';
import { RunsTable } from '@/features/runs/components/runs-table';
import { ApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/lib/auth';

export default function InstrumentRoute() {
  const { instrumentId } = useParams();
  const id = Number(instrumentId);
  const user = useCurrentUser();
  const instrument = useInstrument({ id });
  const jobs = useJobs({ query: { instrumentId: id, sort: '-receivedDate', pageSize: 100 }, enabled: instrument.isSuccess });
  const runs = useRuns({ query: { instrumentId: id, sort: '-startedAt', pageSize: 100 }, enabled: instrument.isSuccess });

  if (instrument.isPending) return <FullPageSpinner label="Loading the instrument" />;
  if (instrument.isError) {
    const missing = instrument.error instanceof ApiError && instrument.error.status === 404;
    return (
      <Alert severity={missing ? 'info' : 'error'}>{missing ? 'There is no such instrument, or it is not yours to see.' : instrument.error.message}</Alert>
    );
  }
  const i = instrument.data;
  const canEdit = BENCH_ROLES.includes(user.role);

  return (
    <>
      <Button component={RouterLink} to={paths.instruments} size="small" startIcon={<ArrowBack />} sx={{ mb: 1 }}>
        Instruments
      </Button>
      <PageHeader
        title={`${i.make} ${i.model}`}
        description={`Serial ${i.serial}${i.assetTag ? ` · asset ${i.assetTag}` : ''} · ${i.organizationName}`}
        actions={
          <Button component={RouterLink} to={bandPlanPath(i.id)} variant="outlined" startIcon={<TravelExploreOutlined />}>
            Band planner
          </Button>
        }
      />
      <Box sx={{ display: 'grid', gap: 2, gridTemplateColumns: 'minmax(0, 1fr)' }}>
        <InstrumentSummary instrument={i} actions={canEdit ? <EditInstrument instrument={i} /> : undefined} />
        <RangesEditor instrument={i} canEdit={canEdit} />
        <AttachmentsPanel owner="instrument" ownerId={i.id} canUpload={canEdit} canDelete={user.role === 'lead' || user.role === 'admin'} />
        <Box sx={{ display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: 2 }}>
          <Paper variant="outlined" sx={{ p: 2 }}>
            <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
              Jobs
            </Typography>
            <JobsList jobs={jobs.data?.items ?? []} emptyText={jobs.isPending ? 'Loading…' : 'No jobs for this instrument yet.'} />
          </Paper>
          <Paper variant="outlined" sx={{ p: 2, overflowX: 'auto' }}>
            <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
              Runs
            </Typography>
            <RunsTable runs={runs.data?.items ?? []} showJob emptyText={runs.isPending ? 'Loading…' : 'No runs on this instrument yet.'} />
          </Paper>
        </Box>
      </Box>
    </>
  );
}
