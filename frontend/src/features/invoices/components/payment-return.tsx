import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState, type ReactNode } from 'react';
import { useSearchParams } from 'react-router-dom';
import { PdfButton } from '@/components/billing/pdf-button';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { ApiError } from '@/lib/api-client';
import { downloadInvoicePdf } from '../api/download-invoice-pdf';
import { useInvoice } from '../api/get-invoice';
import { refreshInvoices } from '../api/refresh-invoices';
import { InvoiceHeading, InvoiceView } from './invoice-view';
import { payable, settled } from '../utils/payable';
import { PayInvoiceButton } from './pay-invoice-button';

/** How often, and how long, the page asks for the invoice while the payment service's confirmation is on its way. */
export const PAYMENT_POLL = { everyMs: 1000, forMs: 15_000 } as const;

type PaymentReturnProps = {
  invoiceId: number;
  /** The job's certificate (a download, or why it is still held), composed by the route. */
  certificate: (jobId: number) => ReactNode;
};

/**
 * A client's invoice, and where the payment service sends the client back: `?payment=done` waits a few seconds
 * for the payment's confirmation (the webhook may land a moment after the redirect) and then thanks them;
 * `?payment=cancelled` says nothing was paid and offers the card again.
 */
export function PaymentReturn({ invoiceId, certificate }: PaymentReturnProps) {
  const [params] = useSearchParams();
  const outcome = params.get('payment');
  const waiting = outcome === 'done';
  const [gaveUp, setGaveUp] = useState(false);
  const queryClient = useQueryClient();
  // Polled until it is settled or the wait is over (a function, so the answer just fetched decides).
  const invoice = useInvoice({
    id: invoiceId,
    refetchInterval: (data) => (waiting && !gaveUp && !(data && settled(data)) ? PAYMENT_POLL.everyMs : false),
  });
  const confirmed = waiting && invoice.data !== undefined && settled(invoice.data);

  useEffect(() => {
    if (!waiting) return;
    const timer = window.setTimeout(() => setGaveUp(true), PAYMENT_POLL.forMs);
    return () => window.clearTimeout(timer);
  }, [waiting]);
  useEffect(() => {
    // The payment releases the certificate: what the client sees of it is fetched again.
    if (confirmed) void refreshInvoices(queryClient);
  }, [confirmed, queryClient]);

  if (invoice.isPending) return <FullPageSpinner label="Loading the invoice" />;
  if (invoice.isError) {
    const missing = invoice.error instanceof ApiError && invoice.error.status === 404;
    return <Alert severity={missing ? 'info' : 'error'}>{missing ? 'There is no such invoice, or it is not yours to see.' : invoice.error.message}</Alert>;
  }
  const i = invoice.data;
  const paidNow = confirmed;

  return (
    <Box sx={{ maxWidth: 1100 }}>
      <Box sx={{ mb: 2 }}>
        <InvoiceHeading invoice={i} component="h1" />
      </Box>
      {paidNow && (
        <Alert severity="success" sx={{ mb: 2 }}>
          <Typography component="div" sx={{ fontWeight: 600 }}>
            Payment received — thank you.
          </Typography>
          Your certificate is below.
        </Alert>
      )}
      {waiting && !paidNow && !gaveUp && (
        <Alert severity="info" icon={<CircularProgress size={18} />} sx={{ mb: 2 }} role="status">
          Confirming your payment with the card service…
        </Alert>
      )}
      {waiting && !paidNow && gaveUp && (
        <Alert severity="warning" sx={{ mb: 2 }}>
          The card service has not confirmed the payment yet. If your card was charged, the invoice shows it as paid within a few minutes: look again shortly.
          Nothing needs paying twice.
        </Alert>
      )}
      {outcome === 'cancelled' && (
        <Alert severity="warning" sx={{ mb: 2 }}>
          The payment was cancelled: nothing was charged. You can pay again whenever you are ready.
        </Alert>
      )}
      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap', mb: 2, alignItems: 'center' }}>
        {payable(i) && !(waiting && !gaveUp) && <PayInvoiceButton invoiceId={i.id} invoiceNumber={i.number} size="medium" />}
        <PdfButton download={() => downloadInvoicePdf(i)} ariaLabel={`Download invoice ${i.number ?? ''} as PDF`} />
      </Box>
      <Paper variant="outlined" component="section" aria-label="Certificate" sx={{ p: 2, mb: 2 }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Certificate
        </Typography>
        {certificate(i.jobId)}
      </Paper>
      <Paper variant="outlined" sx={{ p: 2 }}>
        <InvoiceView invoice={i} canBill={false} />
      </Paper>
    </Box>
  );
}
