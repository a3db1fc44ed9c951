import DrawOutlined from '@mui/icons-material/DrawOutlined';
import ReplyOutlined from '@mui/icons-material/ReplyOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Tooltip from '@mui/material/Tooltip';
import { useState } from 'react';
import type { CertificateDetail, JobReview } from '@kilocycle/common/types';
import { useCurrentUser } from '@/lib/auth';
import { ReturnDialog } from './return-dialog';
import { SignDialog } from './sign-dialog';

type ReviewActionsProps = { review: JobReview; onSigned: (certificate: CertificateDetail) => void };

/** The lead's two answers to a job in review: back to the technician with comments, or signed and issued. */
export function ReviewActions({ review, onSigned }: ReviewActionsProps) {
  const user = useCurrentUser();
  const [dialog, setDialog] = useState<'return' | 'sign' | null>(null);
  const { job } = review;
  if (user.role !== 'lead' || job.status !== 'in_review') return null;

  const blocked = !review.canSign;
  const signButton = (
    <Button variant="contained" startIcon={<DrawOutlined />} onClick={() => setDialog('sign')} disabled={blocked}>
      Sign and issue
    </Button>
  );

  return (
    <Box sx={{ display: 'flex', gap: 1 }}>
      <Button variant="outlined" color="warning" startIcon={<ReplyOutlined />} onClick={() => setDialog('return')}>
        Return with comments
      </Button>
      {blocked ? (
        <Tooltip title={review.signBlockers.join('; ') || 'This job cannot be signed now'}>
          <span>{signButton}</span>
        </Tooltip>
      ) : (
        signButton
      )}
      <ReturnDialog open={dialog === 'return'} jobId={job.id} jobNumber={job.number} technician={job.technicianName} onClose={() => setDialog(null)} />
      <SignDialog
        open={dialog === 'sign'}
        jobId={job.id}
        jobNumber={job.number}
        customer={job.organizationName}
        instrument={job.instrumentLabel}
        onClose={() => setDialog(null)}
        onSigned={(certificate) => {
          setDialog(null);
          onSigned(certificate);
        }}
      />
    </Box>
  );
}
