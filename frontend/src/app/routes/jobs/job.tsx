import ArrowBack from '@mui/icons-material/ArrowBack';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { Link as RouterLink, useNavigate, useParams } from 'react-router-dom';
import { BENCH_ROLES, LAB_ROLES, MANAGER_ROLES, OPEN_JOB_STATUSES } from '@kilocycle/common/rules';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { Num } from '@/components/ui/num';
import { instrumentPath, paths, reviewPath, runPath } from '@/config/paths';
import { useBenches } from '@/features/benches/api/get-benches';
import { AttachmentsPanel } from '@/features/attachments/components/attachments-panel';
import { InvoicePanel } from '@/features/invoices/components/invoice-panel';
import { useInstrument } from '@/features/instruments/api/get-instrument';
import { getJobQueryOptions, useJob } from '@/features/jobs/api/get-job';
import { JobActions } from '@/features/jobs/components/job-actions';
import { JobDetails } from '@/features/jobs/components/job-details';
import { JobHistory } from '@/features/jobs/components/job-history';
import { JobStatusChip } from '@/features/jobs/components/job-status-chip';
import { JobResultsPanel } from '@/features/reviews/components/job-results-panel';
import { JobReviewActions } from '@/features/reviews/components/job-review-actions';
import { QuotePanel } from '@/features/quotes/components/quote-panel';
import { useRuns } from '@/features/runs/api/get-runs';
import { kindsFor, OpenRunDialog } from '@/features/runs/components/open-run-dialog';
import { RunsTable } from '@/features/runs/components/runs-table';
import { useStandards } from '@/lib/get-standards';
import { useUsers } from '@/features/users/api/get-users';
import { ApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/lib/auth';
import { formatDate } from '@/utils/format';

export default function JobRoute() {
  const { jobId } = useParams();
  const id = Number(jobId);
  const user = useCurrentUser();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const isLab = LAB_ROLES.includes(user.role);
  const job = useJob({ id });
  const runs = useRuns({ query: { jobId: id, sort: '-startedAt', pageSize: 200 }, enabled: job.isSuccess });
  const mayOpenRuns = isLab && kindsFor(user.role).length > 0 && job.data !== undefined && OPEN_JOB_STATUSES.includes(job.data.status);
  const instrument = useInstrument({ id: job.data?.instrumentId ?? 0, enabled: job.isSuccess });
  const benches = useBenches({ query: { active: true, pageSize: 200, sort: 'name' }, enabled: mayOpenRuns });
  const standards = useStandards({ query: { active: true, pageSize: 200, sort: 'name' }, enabled: mayOpenRuns });
  const technicians = useUsers({ query: { role: 'technician', active: true, pageSize: 100, sort: 'name' } });

  if (job.isPending) return <FullPageSpinner label="Loading the job" />;
  if (job.isError) {
    const missing = job.error instanceof ApiError && job.error.status === 404;
    return <Alert severity={missing ? 'info' : 'error'}>{missing ? 'There is no such job, or it is not yours to see.' : job.error.message}</Alert>;
  }
  const j = job.data;

  return (
    <>
      <Button component={RouterLink} to={paths.jobs} size="small" startIcon={<ArrowBack />} sx={{ mb: 1 }}>
        Jobs
      </Button>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5, flexWrap: 'wrap', mb: 0.5 }}>
        <Typography variant="h1" component="h1">
          Job <Num>{j.number}</Num>
        </Typography>
        <JobStatusChip status={j.status} />
      </Box>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
        {j.instrumentLabel} · {j.organizationName} · received <Num>{formatDate(j.receivedDate)}</Num>
      </Typography>
      <Box sx={{ mb: 2 }}>
        <JobActions
          job={j}
          role={user.role}
          reviewLink={
            <Link component={RouterLink} to={reviewPath(j.id)}>
              Open the review
            </Link>
          }
        />
      </Box>
      {isLab && <JobReviewActions jobId={j.id} reviewPath={reviewPath(j.id)} />}
      <Box sx={{ display: 'grid', gap: 2 }}>
        <JobDetails
          job={j}
          canEdit={BENCH_ROLES.includes(user.role)}
          technicians={(technicians.data?.items ?? []).map((t) => ({ value: String(t.id), label: t.name }))}
          instrumentLink={
            <Link component={RouterLink} to={instrumentPath(j.instrumentId)}>
              {j.instrumentLabel}
            </Link>
          }
        />
        {/* What the work will cost, agreed before it starts (a client answers quotes in its portal). */}
        {isLab && <QuotePanel jobId={j.id} closed={j.status === 'approved' || j.status === 'issued'} />}
        <Paper variant="outlined" sx={{ p: 2, overflowX: 'auto' }}>
          <Box sx={{ display: 'flex', alignItems: 'center', mb: 1 }}>
            <Typography variant="h3" component="h2" sx={{ flex: 1 }}>
              Runs
            </Typography>
            {mayOpenRuns && (
              <OpenRunDialog
                jobId={j.id}
                role={user.role}
                ranges={(instrument.data?.ranges ?? []).map((r) => ({ value: String(r.id), label: `${r.position}. ${r.label}` }))}
                benches={(benches.data?.items ?? []).map((b) => ({
                  value: String(b.id),
                  label: b.name,
                  defaultStandardId: b.defaultStandardId === null ? null : String(b.defaultStandardId),
                }))}
                standards={(standards.data?.items ?? []).map((s) => ({
                  value: String(s.id),
                  label: `${s.name} (due ${formatDate(s.dueDate)})`,
                  overdue: s.overdue,
                }))}
                onOpened={(run) => {
                  // Opening a run moves a received or returned job to in progress.
                  void queryClient.invalidateQueries({ queryKey: getJobQueryOptions(j.id).queryKey });
                  navigate(runPath(run.id));
                }}
              />
            )}
          </Box>
          <RunsTable runs={runs.data?.items ?? []} emptyText={runs.isPending ? 'Loading…' : 'No runs yet. Open one to start capturing readings.'} />
        </Paper>
        {runs.data?.items.some((r) => r.kind === 'as_found' || r.kind === 'as_left') && <JobResultsPanel jobId={j.id} />}
        {/* What the job is invoiced, for the lab's staff (a client pays in its portal). */}
        {isLab && <InvoicePanel jobId={j.id} jobIssued={j.status === 'issued'} />}
        <AttachmentsPanel owner="job" ownerId={j.id} canUpload={BENCH_ROLES.includes(user.role)} canDelete={MANAGER_ROLES.includes(user.role)} />
        {isLab && <JobHistory jobId={j.id} />}
      </Box>
    </>
  );
}
