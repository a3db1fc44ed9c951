import ArrowBack from '@mui/icons-material/ArrowBack';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import { Link as RouterLink, useParams } from 'react-router-dom';
import { BILLING_ROLES } from '@kilocycle/common/rules';
import { FullPageSpinner } from '@/components/ui/full-page-spinner';
import { paths } from '@/config/paths';
import { useInvoice } from '@/features/invoices/api/get-invoice';
import { InvoiceHeading, InvoiceView } from '@/features/invoices/components/invoice-view';
import { ApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/lib/auth';

export default function InvoiceRoute() {
  const { invoiceId } = useParams();
  const user = useCurrentUser();
  const invoice = useInvoice({ id: Number(invoiceId) });

  if (invoice.isPending) return <FullPageSpinner label="Loading the invoice" />;
  if (invoice.isError) {
    const missing = invoice.error instanceof ApiError && invoice.error.status === 404;
    return <Alert severity={missing ? 'info' : 'error'}>{missing ? 'There is no such invoice.' : invoice.error.message}</Alert>;
  }
  return (
    <>
      <Button component={RouterLink} to={paths.invoices} size="small" startIcon={<ArrowBack />} sx={{ mb: 1 }}>
        Invoices
      </Button>
      <Box sx={{ mb: 2 }}>
        <InvoiceHeading invoice={invoice.data} component="h1" />
      </Box>
      <Paper variant="outlined" sx={{ p: 2 }}>
        <InvoiceView invoice={invoice.data} canBill={BILLING_ROLES.includes(user.role)} linkJob linkCustomer />
      </Paper>
    </>
  );
}
