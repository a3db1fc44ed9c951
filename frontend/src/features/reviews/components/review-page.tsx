import ArrowBackOutlined from '@mui/icons-material/ArrowBackOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import { useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { CertificateDetail, JobStatus } from '@kilocycle/common/types';
import { ErrorBoundary } from '@/components/errors/error-boundary';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { PageHeader } from '@/components/ui/page-header';
import { useCurrentUser } from '@/lib/auth';
import { useJobCertificates } from '../api/get-job-certificates';
import { useReview } from '../api/get-review';
import { rangeUnit } from '../utils/results-format';
import { CertificateIssued } from './certificate-issued';
import { DownloadResultsCsv } from './download-results-csv';
import { ExcludedReadings } from './excluded-readings';
import { JobOutcomesSummary } from './job-outcomes';
import { JobSummary } from './job-summary';
import { ResultsOverview } from './results-overview';
import { ReviewActions } from './review-actions';
import { ReviewFlags } from './review-flags';
import { ReviewHistory } from './review-history';
import { ReviewRuns } from './review-runs';

const STATUS_LABELS: Record<JobStatus, string> = {
  received: 'Received',
  in_progress: 'In progress',
  in_review: 'In review',
  returned: 'Returned',
  approved: 'Approved',
  issued: 'Issued',
};

type ReviewPageProps = { jobId: number; queuePath: string; jobPath?: string; runPath?: (runId: number) => string };

/** Everything the lead needs to decide on a job: what was measured, what follows from it, what is flagged. */
export function ReviewPage({ jobId, queuePath, jobPath, runPath }: ReviewPageProps) {
  const user = useCurrentUser();
  const review = useReview(jobId);
  const [signed, setSigned] = useState<CertificateDetail | null>(null);
  const status = review.data?.job.status;
  const certificates = useJobCertificates(jobId, { enabled: signed === null && (status === 'issued' || status === 'approved') });

  if (review.isPending) return <FullPageSpinner label="Loading the review" />;
  if (review.isError) {
    return (
      <Alert
        severity="error"
        action={
          <Button component={RouterLink} to={queuePath}>
            Back to the queue
          </Button>
        }
      >
        The review could not be loaded: {review.error.message}
      </Alert>
    );
  }
  const data = review.data;
  const { job } = data;
  const current = signed ?? certificates.data?.items.find((c) => c.status === 'issued') ?? certificates.data?.items[0] ?? null;
  const rangeUnits = Object.fromEntries(data.results.ranges.map((r) => [r.rangeId, r.dialUnit === 'div' ? 'div' : rangeUnit(r)]));
  const canEditBudgets = (user.role === 'lead' || user.role === 'technician') && job.status !== 'issued' && job.status !== 'approved';

  return (
    <Box sx={{ maxWidth: 1400 }}>
      <Button component={RouterLink} to={queuePath} size="small" startIcon={<ArrowBackOutlined />} sx={{ mb: 1 }}>
        Review queue
      </Button>
      <PageHeader
        title={`Review of job ${job.number}`}
        description={
          <>
            {job.instrumentLabel} · {job.organizationName} <Chip size="small" label={STATUS_LABELS[job.status]} sx={{ height: 20, ml: 0.5, mr: 1.5 }} />
            <JobOutcomesSummary outcomes={data.results.outcomes} compact />
            {jobPath && (
              <Button component={RouterLink} to={jobPath} size="small" sx={{ ml: 1 }}>
                Open the job
              </Button>
            )}
          </>
        }
        actions={
          <>
            <DownloadResultsCsv jobId={job.id} jobNumber={job.number} />
            <ReviewActions review={data} onSigned={setSigned} />
          </>
        }
      />
      {current && <CertificateIssued certificate={current} fresh={signed !== null} />}
      {job.status !== 'in_review' && !current && (
        <Alert severity="info" sx={{ mb: 2 }}>
          This job is {STATUS_LABELS[job.status].toLowerCase()}, not in review: it can be read here, but not signed.
        </Alert>
      )}
      <JobSummary review={data} />
      <ReviewFlags flags={data.flags} signBlockers={job.status === 'in_review' ? data.signBlockers : []} />
      <ErrorBoundary>
        <ResultsOverview results={data.results} />
      </ErrorBoundary>
      <ReviewRuns runs={data.runs} canEditBudgets={canEditBudgets} rangeUnits={rangeUnits} runPath={runPath} />
      <ExcludedReadings readings={data.excludedReadings} />
      <ReviewHistory history={data.history} />
    </Box>
  );
}
