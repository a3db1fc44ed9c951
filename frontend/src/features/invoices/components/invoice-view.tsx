import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useState, type ReactNode } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { formatMoney } from '@kilocycle/common/money';
import type { Invoice, Payment } from '@kilocycle/common/types';
import { BillingLines } from '@/components/billing/billing-lines';
import { Money } from '@/components/billing/money';
import { PdfButton } from '@/components/billing/pdf-button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { serverMessages } from '@/components/ui/form-dialog';
import { FormErrors } from '@/components/ui/form-errors';
import { HiddenLabel } from '@/components/ui/hidden-label';
import { Num, numberSx } from '@/components/ui/num';
import { HIDE_ON_PHONE, PhoneSecondLine } from '@/components/ui/phone-columns';
import { jobPath, statementPath } from '@/config/paths';
import { notify } from '@/lib/notifications';
import { formatDate, formatDateTime } from '@/utils/format';
import { useCreateCreditNote } from '../api/create-credit-note';
import { downloadCreditNotePdf } from '../api/download-credit-note-pdf';
import { downloadInvoicePdf } from '../api/download-invoice-pdf';
import { usePayments } from '../api/get-payments';
import { useIssueInvoice } from '../api/issue-invoice';
import { useRefundPayment } from '../api/refund-payment';
import { useUpdateInvoice } from '../api/update-invoice';
import { AmountReasonDialog } from './amount-reason-dialog';
import { InvoiceStatusChip, PAYMENT_STATUS_LABELS } from './invoice-status-chip';

function Field({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Box sx={{ minWidth: 0 }}>
      <Typography variant="caption" color="text.secondary" component="div">
        {label}
      </Typography>
      <Typography variant="body2" component="div">
        {children}
      </Typography>
    </Box>
  );
}

const REFUNDABLE: readonly Payment['status'][] = ['succeeded', 'part_refunded'];

type InvoiceViewProps = {
  invoice: Invoice;
  /** Admin and lead: edit a draft, issue, credit and refund. */
  canBill: boolean;
  /** Link the job number to the job's page (lab pages other than the job's own). */
  linkJob?: boolean;
  /** Link the customer to its statement (lab pages). */
  linkCustomer?: boolean;
};

/** One invoice: its state, dates and figures as the server gives them, its lines, credit notes and payments. */
export function InvoiceView({ invoice, canBill, linkJob = false, linkCustomer = false }: InvoiceViewProps) {
  const [confirmIssue, setConfirmIssue] = useState(false);
  const [crediting, setCrediting] = useState(false);
  const [refunding, setRefunding] = useState<Payment | null>(null);
  const update = useUpdateInvoice();
  const issue = useIssueInvoice({
    onSuccess: (issued) => {
      setConfirmIssue(false);
      notify('success', `Invoice ${issued.number ?? ''} issued and sent to the customer.`);
    },
  });
  const credit = useCreateCreditNote({
    onSuccess: (note) => {
      setCrediting(false);
      notify('success', `Credit note ${note.number} raised.`);
    },
  });
  const refund = useRefundPayment({
    onSuccess: () => {
      setRefunding(null);
      notify('success', 'Refund sent to the card; a credit note records it.');
    },
  });
  const isDraft = invoice.status === 'draft';
  const payments = usePayments({ query: { invoiceId: invoice.id, sort: '-createdAt', pageSize: 100 }, enabled: !isDraft });
  const currency = invoice.currency;
  const money = (minor: number) => formatMoney(minor, currency);
  const cell = { ...numberSx, textAlign: 'right' } as const;
  const title = invoice.number ? `invoice ${invoice.number}` : 'the draft invoice';

  return (
    <Box>
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'repeat(2, minmax(0, 1fr))', md: 'repeat(4, minmax(0, 1fr))' }, gap: 2, mb: 2 }}>
        <Field label="Customer">
          {linkCustomer ? (
            <Link component={RouterLink} to={statementPath(invoice.organizationId)}>
              {invoice.organizationName}
            </Link>
          ) : (
            invoice.organizationName
          )}
        </Field>
        <Field label="Job">
          {linkJob ? (
            <Link component={RouterLink} to={jobPath(invoice.jobId)}>
              <Num>{invoice.jobNumber}</Num>
            </Link>
          ) : (
            <Num>{invoice.jobNumber}</Num>
          )}
        </Field>
        <Field label="Issued">
          <Num>{formatDate(invoice.issuedAt)}</Num>
        </Field>
        <Field label="Due">
          <Num>{invoice.dueDate ?? '—'}</Num>{' '}
          {invoice.overdue && (
            <Box component="span" sx={{ color: 'error.main' }}>
              (overdue)
            </Box>
          )}
        </Field>
        <Field label="Terms">{invoice.paymentTerms === 'on_account' ? 'On account' : 'Pay before release'}</Field>
        <Field label="Total">
          <Money minor={invoice.totals.grossMinor} currency={currency} />
        </Field>
        <Field label="Paid">
          <Money minor={invoice.paidMinor} currency={currency} />
          {invoice.refundedMinor !== 0 && (
            <Typography variant="caption" color="text.secondary" component="div">
              refunded {money(invoice.refundedMinor)}
            </Typography>
          )}
        </Field>
        <Field label="Credited">
          <Money minor={invoice.creditedMinor} currency={currency} />
        </Field>
        <Field label="Balance">
          <Money minor={invoice.balanceMinor} currency={currency} sx={{ fontWeight: 600 }} />
        </Field>
      </Box>
      {isDraft && (
        <Alert severity="info" sx={{ mb: 1.5 }}>
          A draft: the customer does not see it yet. {canBill ? 'Check the lines, then issue it; once issued it cannot change.' : ''}
        </Alert>
      )}
      <BillingLines
        label={`Lines of ${title}`}
        lines={invoice.lines}
        totals={invoice.totals}
        currency={currency}
        taxExempt={invoice.taxExempt}
        taxRegistration={invoice.taxRegistration}
        save={canBill && isDraft ? (lines) => update.mutateAsync({ id: invoice.id, changes: { lines } }) : undefined}
      />
      <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap', mt: 1.5 }}>
        {canBill && isDraft && (
          <Button variant="contained" size="small" disabled={invoice.lines.length === 0} onClick={() => setConfirmIssue(true)}>
            Issue the invoice
          </Button>
        )}
        {canBill && !isDraft && invoice.status !== 'credited' && (
          <Button size="small" variant="outlined" onClick={() => setCrediting(true)}>
            Raise credit note
          </Button>
        )}
        {!isDraft && <PdfButton download={() => downloadInvoicePdf(invoice)} ariaLabel={`Download ${title} as PDF`} />}
      </Box>

      {invoice.creditNotes.length > 0 && (
        <Box sx={{ mt: 2 }}>
          <Typography variant="subtitle2" component="h3">
            Credit notes
          </Typography>
          <Table size="small" aria-label={`Credit notes of ${title}`} sx={{ '& td, & th': { px: 1 } }}>
            <TableHead>
              <TableRow>
                <TableCell>Number</TableCell>
                <TableCell sx={HIDE_ON_PHONE}>Date</TableCell>
                <TableCell sx={HIDE_ON_PHONE}>Reason</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>Amount</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>
                  <HiddenLabel>PDF</HiddenLabel>
                </TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {invoice.creditNotes.map((note) => (
                <TableRow key={note.id}>
                  <TableCell>
                    <Num>{note.number}</Num>
                    <PhoneSecondLine parts={[formatDate(note.issuedAt), note.reason, note.paymentId !== null && 'card refund']} />
                  </TableCell>
                  <TableCell sx={{ ...numberSx, ...HIDE_ON_PHONE }}>{formatDate(note.issuedAt)}</TableCell>
                  <TableCell sx={{ ...HIDE_ON_PHONE, whiteSpace: 'pre-wrap' }}>
                    {note.reason}
                    {note.paymentId !== null && ' (card refund)'}
                  </TableCell>
                  <TableCell sx={cell}>{money(note.grossMinor)}</TableCell>
                  <TableCell sx={{ textAlign: 'right', py: 0 }}>
                    <PdfButton download={() => downloadCreditNotePdf(note)} ariaLabel={`Download credit note ${note.number} as PDF`} />
                  </TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </Box>
      )}

      {!isDraft && (payments.data?.items.length ?? 0) > 0 && (
        <Box sx={{ mt: 2 }}>
          <Typography variant="subtitle2" component="h3">
            Card payments
          </Typography>
          <Table size="small" aria-label={`Payments of ${title}`} sx={{ '& td, & th': { px: 1 } }}>
            <TableHead>
              <TableRow>
                <TableCell>Date</TableCell>
                <TableCell>State</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>Amount</TableCell>
                <TableCell sx={{ ...HIDE_ON_PHONE, textAlign: 'right' }}>Refunded</TableCell>
                {canBill && (
                  <TableCell sx={{ textAlign: 'right' }}>
                    <HiddenLabel>Actions</HiddenLabel>
                  </TableCell>
                )}
              </TableRow>
            </TableHead>
            <TableBody>
              {payments.data?.items.map((payment) => (
                <TableRow key={payment.id}>
                  <TableCell sx={numberSx}>
                    {formatDateTime(payment.createdAt)}
                    <PhoneSecondLine parts={[payment.refundedMinor !== 0 && `refunded ${money(payment.refundedMinor)}`]} />
                  </TableCell>
                  <TableCell>
                    {PAYMENT_STATUS_LABELS[payment.status]}
                    {payment.failureMessage && (
                      <Typography variant="caption" color="text.secondary" component="div">
                        {payment.failureMessage}
                      </Typography>
                    )}
                  </TableCell>
                  <TableCell sx={cell}>{money(payment.amountMinor)}</TableCell>
                  <TableCell sx={{ ...cell, ...HIDE_ON_PHONE }}>{money(payment.refundedMinor)}</TableCell>
                  {canBill && (
                    <TableCell sx={{ textAlign: 'right', py: 0 }}>
                      {REFUNDABLE.includes(payment.status) && (
                        <Button size="small" aria-label={`Refund the payment of ${money(payment.amountMinor)}`} onClick={() => setRefunding(payment)}>
                          Refund
                        </Button>
                      )}
                    </TableCell>
                  )}
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </Box>
      )}

      {canBill && isDraft && (
        <ConfirmDialog
          open={confirmIssue}
          title="Issue this invoice?"
          confirmLabel={issue.isPending ? 'Issuing…' : 'Issue'}
          busy={issue.isPending}
          onClose={() => {
            setConfirmIssue(false);
            issue.reset();
          }}
          onConfirm={() => issue.mutate(invoice.id)}
        >
          It takes the next invoice number and a due date from the customer’s terms, and goes as a PDF to the customer, for a total of{' '}
          <Money minor={invoice.totals.grossMinor} currency={currency} />. An issued invoice never changes; a correction is a credit note.
          <Box sx={{ mt: 1 }}>
            <FormErrors messages={serverMessages(issue.error, 'The invoice could not be issued.')} />
          </Box>
        </ConfirmDialog>
      )}
      {canBill && !isDraft && (
        <>
          <AmountReasonDialog
            open={crediting}
            title={`Credit note against ${title}`}
            intro="Lowers what the customer owes. The tax is split in the invoice’s own proportion."
            currency={currency}
            maxMinor={invoice.totals.grossMinor}
            submitLabel="Raise credit note"
            pending={credit.isPending}
            error={credit.error}
            onSubmit={(body) => credit.mutate({ invoiceId: invoice.id, ...body })}
            onClose={() => setCrediting(false)}
            onExited={() => credit.reset()}
          />
          <AmountReasonDialog
            open={refunding !== null}
            title="Refund to the card"
            intro={
              refunding &&
              `Of the payment of ${money(refunding.amountMinor)} made ${formatDate(refunding.createdAt)}. A credit note of the refunded amount is raised with it.`
            }
            currency={currency}
            maxMinor={refunding?.amountMinor ?? 0}
            suggestedMinor={refunding?.amountMinor}
            submitLabel="Refund"
            pending={refund.isPending}
            error={refund.error}
            onSubmit={(body) => refunding && refund.mutate({ paymentId: refunding.id, ...body })}
            onClose={() => setRefunding(null)}
            onExited={() => refund.reset()}
          />
        </>
      )}
    </Box>
  );
}

/** The invoice's heading line: its number (or "Draft invoice") and its state. */
export function InvoiceHeading({ invoice, component = 'h2' }: { invoice: Invoice; component?: 'h1' | 'h2' }) {
  return (
    <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap' }}>
      <Typography variant={component === 'h1' ? 'h1' : 'h3'} component={component} sx={{ flex: component === 'h1' ? undefined : 1 }}>
        {invoice.number ? (
          <>
            Invoice <Num>{invoice.number}</Num>
          </>
        ) : (
          'Draft invoice'
        )}
      </Typography>
      <InvoiceStatusChip invoice={invoice} />
    </Box>
  );
}
