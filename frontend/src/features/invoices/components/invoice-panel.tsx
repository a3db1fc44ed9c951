import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { BILLING_ROLES } from '@kilocycle/common/rules';
import { serverMessages } from '@/components/ui/form-dialog';
import { FormErrors } from '@/components/ui/form-errors';
import { useCurrentUser } from '@/lib/auth';
import { notify } from '@/lib/notifications';
import { useCreateInvoice } from '../api/create-invoice';
import { useInvoices } from '../api/get-invoices';
import { InvoiceHeading, InvoiceView } from './invoice-view';

type InvoicePanelProps = {
  jobId: number;
  /** The job's certificate is issued: an invoice is due (the server drafts one at signing). */
  jobIssued: boolean;
};

/** The job's invoice on its page: the draft the lead checks and issues, then what is paid, credited and owed. */
export function InvoicePanel({ jobId, jobIssued }: InvoicePanelProps) {
  const user = useCurrentUser();
  const canBill = BILLING_ROLES.includes(user.role);
  const invoices = useInvoices({ query: { jobId, pageSize: 10 } });
  const create = useCreateInvoice({ onSuccess: () => notify('success', 'Draft invoice made.') });
  const invoice = invoices.data?.items[0];

  return (
    <Paper variant="outlined" component="section" aria-label="Invoice" sx={{ p: 2 }}>
      {invoice ? (
        <Box sx={{ mb: 1 }}>
          <InvoiceHeading invoice={invoice} />
        </Box>
      ) : (
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Invoice
        </Typography>
      )}
      {invoices.isPending && <Typography color="text.secondary">Loading…</Typography>}
      {invoices.isError && <Alert severity="error">The invoice could not be loaded.</Alert>}
      {invoices.isSuccess && !invoice && (
        <>
          <Typography variant="body2" color="text.secondary">
            {jobIssued
              ? 'No invoice for this job. One is drafted when the certificate is signed, from the accepted quote or the proposed lines.'
              : 'An invoice is drafted when the certificate is signed.'}
          </Typography>
          <FormErrors messages={serverMessages(create.error, 'The invoice could not be made.')} />
          {canBill && jobIssued && (
            <Button variant="contained" size="small" sx={{ mt: 1 }} disabled={create.isPending} onClick={() => create.mutate(jobId)}>
              Make a draft invoice
            </Button>
          )}
        </>
      )}
      {invoice && <InvoiceView invoice={invoice} canBill={canBill} linkCustomer />}
    </Paper>
  );
}
