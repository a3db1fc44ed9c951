import Chip from '@mui/material/Chip';
import type { CertificateStatus } from '@kilocycle/common/types';

export const CERTIFICATE_STATUS_LABELS: Record<CertificateStatus, string> = {
  draft: 'Draft',
  issued: 'Issued',
  superseded: 'Superseded',
  withdrawn: 'Withdrawn',
};

const COLORS: Record<CertificateStatus, 'default' | 'success' | 'warning' | 'error'> = {
  draft: 'default',
  issued: 'success',
  superseded: 'warning',
  withdrawn: 'error',
};

export function CertificateStatusChip({ status, label }: { status: CertificateStatus; label?: string }) {
  return (
    <Chip
      size="small"
      color={COLORS[status]}
      variant={status === 'issued' ? 'filled' : 'outlined'}
      label={label ?? CERTIFICATE_STATUS_LABELS[status]}
      sx={{ height: 20, fontSize: '0.75rem', fontWeight: 500 }}
    />
  );
}
