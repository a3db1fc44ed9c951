import RateReviewOutlined from '@mui/icons-material/RateReviewOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { CertificateDetail } from '@kilocycle/common/types';
import { useCurrentUser } from '@/lib/auth';
import { useJobCertificates } from '../api/get-job-certificates';
import { useReview } from '../api/get-review';
import { CertificateIssued } from './certificate-issued';
import { DownloadResultsCsv } from './download-results-csv';
import { ReviewActions } from './review-actions';

type JobReviewActionsProps = { jobId: number; reviewPath: string };

/** For the job page: "Return" and "Sign" for the lead, the issued certificate once there is one, and the results as CSV. */
export function JobReviewActions({ jobId, reviewPath }: JobReviewActionsProps) {
  const user = useCurrentUser();
  // The review is lab staff's business; a client reads the certificates instead.
  const review = useReview(jobId, { enabled: user.role !== 'client' });
  const [signed, setSigned] = useState<CertificateDetail | null>(null);
  const status = review.data?.job.status;
  const certificates = useJobCertificates(jobId, { enabled: signed === null && (status === 'issued' || status === 'approved') });
  if (!review.data) return null;
  const { job } = review.data;
  const current = signed ?? certificates.data?.items.find((c) => c.status === 'issued') ?? null;

  return (
    <Box sx={{ mb: 2 }}>
      {current && <CertificateIssued certificate={current} fresh={signed !== null} />}
      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap', alignItems: 'center' }}>
        <ReviewActions review={review.data} onSigned={setSigned} />
        <Button component={RouterLink} to={reviewPath} variant="outlined" startIcon={<RateReviewOutlined />}>
          Review page
        </Button>
        <DownloadResultsCsv jobId={job.id} jobNumber={job.number} />
      </Box>
    </Box>
  );
}
