import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import type { Invoice, InvoiceStatus, PaymentStatus } from '@kilocycle/common/types';

export const INVOICE_STATUS_LABELS: Record<InvoiceStatus, string> = {
  draft: 'Draft',
  issued: 'Unpaid',
  part_paid: 'Part paid',
  paid: 'Paid',
  credited: 'Credited',
};

const COLORS: Record<InvoiceStatus, 'default' | 'info' | 'success' | 'warning'> = {
  draft: 'default',
  issued: 'info',
  part_paid: 'warning',
  paid: 'success',
  credited: 'default',
};

/** Where an invoice stands, and "Overdue" beside it when its due date has passed with a balance left. */
export function InvoiceStatusChip({ invoice }: { invoice: Pick<Invoice, 'status' | 'overdue'> }) {
  return (
    <Box component="span" sx={{ display: 'inline-flex', gap: 0.5, flexWrap: 'wrap' }}>
      <Chip
        size="small"
        color={COLORS[invoice.status]}
        variant={invoice.status === 'draft' || invoice.status === 'credited' ? 'outlined' : 'filled'}
        label={INVOICE_STATUS_LABELS[invoice.status]}
        sx={{ height: 22 }}
      />
      {invoice.overdue && <Chip size="small" color="error" label="Overdue" sx={{ height: 22 }} />}
    </Box>
  );
}

export const PAYMENT_STATUS_LABELS: Record<PaymentStatus, string> = {
  pending: 'Waiting for the card',
  succeeded: 'Paid',
  failed: 'Refused',
  refunded: 'Refunded',
  part_refunded: 'Part refunded',
};
