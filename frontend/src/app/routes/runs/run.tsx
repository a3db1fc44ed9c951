import ArrowBack from '@mui/icons-material/ArrowBack';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import { Link as RouterLink, useParams } from 'react-router-dom';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { Num } from '@/components/ui/num';
import { jobPath } from '@/config/paths';
import { useRun } from '@/features/runs/api/get-run';
import { ApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/lib/auth';
import { CalibrationRun } from './calibration-run';
import { AuxRun, TimeSeriesRun } from './study-run';

export default function RunRoute() {
  const { runId } = useParams();
  const id = Number(runId);
  const user = useCurrentUser();
  const run = useRun({ id });

  if (run.isPending) return <FullPageSpinner label="Loading the run" />;
  if (run.isError) {
    const missing = run.error instanceof ApiError && run.error.status === 404;
    return <Alert severity={missing ? 'info' : 'error'}>{missing ? 'There is no such run, or it is not yours to see.' : run.error.message}</Alert>;
  }
  const r = run.data;
  const back = (
    <Button component={RouterLink} to={jobPath(r.jobId)} size="small" startIcon={<ArrowBack />} sx={{ mb: 1 }}>
      Job&nbsp;<Num>{r.jobNumber}</Num>
    </Button>
  );
  switch (r.kind) {
    case 'as_found':
    case 'as_left':
      return (
        <>
          {back}
          <CalibrationRun key={r.id} run={r} role={user.role} />
        </>
      );
    case 'warmup':
    case 'stability':
      return (
        <>
          {back}
          <TimeSeriesRun key={r.id} run={r} role={user.role} />
        </>
      );
    case 'supply_sensitivity':
    case 'keying':
      return (
        <>
          {back}
          <AuxRun key={r.id} run={r} role={user.role} />
        </>
      );
  }
}
