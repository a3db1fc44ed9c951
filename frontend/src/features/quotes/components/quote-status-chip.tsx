import Chip from '@mui/material/Chip';
import type { Quote, QuoteStatus } from '@kilocycle/common/types';
import { formatDate } from '@/utils/format';

export const QUOTE_STATUS_LABELS: Record<QuoteStatus, string> = {
  draft: 'Draft',
  sent: 'Awaiting answer',
  accepted: 'Accepted',
  declined: 'Declined',
  expired: 'Expired',
};

const COLORS: Record<QuoteStatus, 'default' | 'info' | 'success' | 'warning' | 'error'> = {
  draft: 'default',
  sent: 'info',
  accepted: 'success',
  declined: 'error',
  expired: 'warning',
};

/** Where a quote stands; a sent or expired one says until when it was valid. */
export function QuoteStatusChip({ quote }: { quote: Pick<Quote, 'status' | 'validUntil'> }) {
  const until =
    quote.validUntil && (quote.status === 'sent' || quote.status === 'expired')
      ? ` · ${quote.status === 'sent' ? 'until' : 'on'} ${formatDate(quote.validUntil)}`
      : '';
  return (
    <Chip
      size="small"
      color={COLORS[quote.status]}
      variant={quote.status === 'draft' ? 'outlined' : 'filled'}
      label={`${QUOTE_STATUS_LABELS[quote.status]}${until}`}
      sx={{ height: 22 }}
    />
  );
}
