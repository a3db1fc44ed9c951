import Chip from '@mui/material/Chip';
import type { JobStatus } from '@kilocycle/common/types';

export const JOB_STATUS_LABELS: Record<JobStatus, string> = {
  received: 'Received',
  in_progress: 'In progress',
  in_review: 'In review',
  returned: 'Returned for rework',
  approved: 'Approved',
  issued: 'Issued',
};

const COLORS: Record<JobStatus, 'default' | 'primary' | 'secondary' | 'warning' | 'success' | 'info'> = {
  received: 'default',
  in_progress: 'primary',
  in_review: 'info',
  returned: 'warning',
  approved: 'success',
  issued: 'success',
};

export function JobStatusChip({ status }: { status: JobStatus }) {
  return (
    <Chip
      size="small"
      color={COLORS[status]}
      variant={status === 'issued' || status === 'in_progress' ? 'filled' : 'outlined'}
      label={JOB_STATUS_LABELS[status]}
      sx={{ height: 22, fontSize: '0.75rem' }}
    />
  );
}
