import ArrowBackOutlined from '@mui/icons-material/ArrowBackOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router-dom';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { PageHeader } from '@/components/ui/page-header';
import { useCurrentUser } from '@/lib/auth';
import { formatDateTime } from '@/utils/format';
import { useImportRun } from '../api/get-import-run';
import { RunDataTransfer } from './run-data-transfer';

/** A run's readings in and out as files, on a page of its own (linked from the run). */
export function RunImportPage({ runId, runPath }: { runId: number; runPath: string }) {
  const user = useCurrentUser();
  const run = useImportRun(runId);
  if (run.isPending) return <FullPageSpinner label="Loading the run" />;
  if (run.isError) return <Alert severity="error">The run could not be loaded: {run.error.message}</Alert>;
  const r = run.data;
  return (
    <Box sx={{ maxWidth: 1100 }}>
      <Button component={RouterLink} to={runPath} size="small" startIcon={<ArrowBackOutlined />} sx={{ mb: 1 }}>
        Run {r.id}
      </Button>
      <PageHeader title={`Readings of run ${r.id} as files`} description={`${r.instrumentLabel} · ${r.rangeLabel} · job ${r.jobNumber}`} />
      <Paper variant="outlined" sx={{ p: 2 }}>
        <Typography variant="body2" sx={{ mb: 2 }}>
          {r.readingCount.toLocaleString('en-GB')} readings so far ({r.excludedCount} excluded), started {formatDateTime(r.startedAt)}.
          {r.refusal && ` This run takes no readings now: ${r.refusal}.`}
        </Typography>
        <RunDataTransfer run={r} role={user.role} />
      </Paper>
    </Box>
  );
}
