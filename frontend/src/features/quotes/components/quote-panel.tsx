import EditOutlined from '@mui/icons-material/EditOutlined';
import SendOutlined from '@mui/icons-material/SendOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { BILLING_ROLES } from '@kilocycle/common/rules';
import type { Quote } from '@kilocycle/common/types';
import { BillingLines } from '@/components/billing/billing-lines';
import { Money } from '@/components/billing/money';
import { PdfButton } from '@/components/billing/pdf-button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { serverMessages } from '@/components/ui/form-dialog';
import { FormErrors } from '@/components/ui/form-errors';
import { Num } from '@/components/ui/num';
import { useCurrentUser } from '@/lib/auth';
import { notify } from '@/lib/notifications';
import { formatDate } from '@/utils/format';
import { useCreateQuote } from '../api/create-quote';
import { downloadQuotePdf } from '../api/download-quote-pdf';
import { useQuotes } from '../api/get-quotes';
import { useSendQuote } from '../api/send-quote';
import { useUpdateQuote } from '../api/update-quote';
import { DeclineQuoteDialog } from './decline-quote-dialog';
import { QuoteSettingsDialog } from './quote-settings-dialog';
import { QuoteStatusChip } from './quote-status-chip';
import { CHANNEL_LABELS, RecordAcceptanceDialog } from './record-acceptance-dialog';

/** A quote is open while it can still become the job's agreed price. */
const OPEN_STATUSES: readonly Quote['status'][] = ['draft', 'sent', 'accepted'];

function Decision({ quote }: { quote: Quote }) {
  if (quote.status === 'accepted')
    return (
      <Alert severity="success" sx={{ mb: 1.5 }}>
        Accepted <Num>{formatDate(quote.decidedAt)}</Num>
        {quote.acceptanceChannel && ` ${CHANNEL_LABELS[quote.acceptanceChannel].toLowerCase()}`}
        {quote.decidedByName && ` by ${quote.decidedByName}`}.{quote.decisionNote && ` “${quote.decisionNote}”`}
      </Alert>
    );
  if (quote.status === 'declined')
    return (
      <Alert severity="warning" sx={{ mb: 1.5 }}>
        Declined <Num>{formatDate(quote.decidedAt)}</Num>
        {quote.decidedByName && ` by ${quote.decidedByName}`}.{quote.decisionNote && ` “${quote.decisionNote}”`}
      </Alert>
    );
  if (quote.status === 'expired')
    return (
      <Alert severity="warning" sx={{ mb: 1.5 }}>
        Expired unanswered: it was valid until <Num>{formatDate(quote.validUntil)}</Num>. Make a new quote to offer the work again.
      </Alert>
    );
  if (quote.status === 'sent')
    return (
      <Alert severity="info" sx={{ mb: 1.5 }}>
        Sent <Num>{formatDate(quote.sentAt)}</Num>; the customer can accept it in the portal until <Num>{formatDate(quote.validUntil)}</Num>.
      </Alert>
    );
  return null;
}

/** closed: the job's certificate is signed, so no new quote is made for it. */
type QuotePanelProps = { jobId: number; closed?: boolean };

/** The job's quote on its page: made from the proposed lines, edited while a draft, sent, and the customer's answer. */
export function QuotePanel({ jobId, closed = false }: QuotePanelProps) {
  const user = useCurrentUser();
  const canBill = BILLING_ROLES.includes(user.role);
  const quotes = useQuotes({ query: { jobId, sort: '-createdAt', pageSize: 50 } });
  const [settings, setSettings] = useState(false);
  const [confirmSend, setConfirmSend] = useState(false);
  const [accepting, setAccepting] = useState<Quote | null>(null);
  const [declining, setDeclining] = useState<Quote | null>(null);
  const create = useCreateQuote({ onSuccess: (q) => notify('success', `Quote ${q.number} made from the proposed lines.`) });
  const update = useUpdateQuote();
  const send = useSendQuote({
    onSuccess: (q) => {
      setConfirmSend(false);
      notify('success', `Quote ${q.number} sent to the customer.`);
    },
  });

  const all = quotes.data?.items ?? [];
  const quote = all[0];
  const earlier = all.slice(1);
  const mayCreate = canBill && !closed && !all.some((q) => OPEN_STATUSES.includes(q.status));

  return (
    <Paper variant="outlined" component="section" aria-label="Quote" sx={{ p: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap', mb: 1 }}>
        <Typography variant="h3" component="h2" sx={{ flex: 1 }}>
          Quote {quote && <Num>{quote.number}</Num>}
        </Typography>
        {quote && <QuoteStatusChip quote={quote} />}
      </Box>
      {quotes.isPending && <Typography color="text.secondary">Loading…</Typography>}
      {quotes.isError && <Alert severity="error">The quotes could not be loaded.</Alert>}
      <FormErrors messages={serverMessages(create.error, 'The quote could not be made.')} />
      {quotes.isSuccess && !quote && (
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          {closed
            ? 'No quote was made for this job; its invoice starts from the price list.'
            : `No quote for this job yet.${canBill ? ' A new one starts from the price list’s proposed lines for this instrument and its studies.' : ''}`}
        </Typography>
      )}
      {quote && (
        <>
          <Decision quote={quote} />
          <BillingLines
            label={`Lines of quote ${quote.number}`}
            lines={quote.lines}
            totals={quote.totals}
            currency={quote.currency}
            taxExempt={quote.taxExempt}
            taxRegistration={quote.taxRegistration}
            save={canBill && quote.status === 'draft' ? (lines) => update.mutateAsync({ id: quote.id, changes: { lines } }) : undefined}
          />
          <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
            Valid for <Num>{quote.validityDays}</Num> days from sending.{quote.notes && ` Notes: ${quote.notes}`}
          </Typography>
        </>
      )}
      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap', mt: 1.5 }}>
        {mayCreate && (
          <Button variant={quote ? 'outlined' : 'contained'} size="small" disabled={create.isPending} onClick={() => create.mutate(jobId)}>
            {quote ? 'Make a new quote' : 'Make a quote'}
          </Button>
        )}
        {quote && canBill && quote.status === 'draft' && (
          <>
            <Button size="small" startIcon={<EditOutlined />} onClick={() => setSettings(true)}>
              Validity and notes
            </Button>
            <Button variant="contained" size="small" startIcon={<SendOutlined />} disabled={quote.lines.length === 0} onClick={() => setConfirmSend(true)}>
              Send to the customer
            </Button>
          </>
        )}
        {quote && canBill && quote.status === 'sent' && (
          <>
            <Button variant="contained" size="small" onClick={() => setAccepting(quote)}>
              Record acceptance
            </Button>
            <Button size="small" color="error" onClick={() => setDeclining(quote)}>
              Record decline
            </Button>
          </>
        )}
        {quote && quote.status !== 'draft' && <PdfButton download={() => downloadQuotePdf(quote)} ariaLabel={`Download quote ${quote.number} as PDF`} />}
      </Box>
      {earlier.length > 0 && (
        <Box sx={{ mt: 2 }}>
          <Typography variant="subtitle2" component="h3">
            Earlier quotes
          </Typography>
          {earlier.map((q) => (
            <Box key={q.id} sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap', py: 0.5 }}>
              <Num>{q.number}</Num>
              <QuoteStatusChip quote={q} />
              <Money minor={q.totals.grossMinor} currency={q.currency} />
              {q.status !== 'draft' && <PdfButton download={() => downloadQuotePdf(q)} ariaLabel={`Download quote ${q.number} as PDF`} />}
            </Box>
          ))}
        </Box>
      )}
      {quote && canBill && quote.status === 'draft' && (
        <>
          <QuoteSettingsDialog quote={quote} open={settings} onClose={() => setSettings(false)} />
          <ConfirmDialog
            open={confirmSend}
            title={`Send quote ${quote.number}?`}
            confirmLabel={send.isPending ? 'Sending…' : 'Send'}
            busy={send.isPending}
            onClose={() => {
              setConfirmSend(false);
              send.reset();
            }}
            onConfirm={() => send.mutate(quote.id)}
          >
            The quote, for a total of <Money minor={quote.totals.grossMinor} currency={quote.currency} />, goes as a PDF to the customer’s contact e-mail. It
            can no longer change, and the customer can accept it for {quote.validityDays} days.
            <Box sx={{ mt: 1 }}>
              <FormErrors messages={serverMessages(send.error, 'The quote could not be sent.')} />
            </Box>
          </ConfirmDialog>
        </>
      )}
      {canBill && <RecordAcceptanceDialog quote={accepting} onClose={() => setAccepting(null)} />}
      {canBill && <DeclineQuoteDialog quote={declining} byCustomer={false} onClose={() => setDeclining(null)} />}
    </Paper>
  );
}
