import ArrowBack from '@mui/icons-material/ArrowBack';
import Button from '@mui/material/Button';
import { Link as RouterLink, useParams } from 'react-router-dom';
import { paths, verifyPath } from '@/config/paths';
import { JobCertificate } from '@/features/certificates/components/job-certificate';
import { PaymentReturn } from '@/features/invoices/components/payment-return';
import { PayInvoiceButton } from '@/features/invoices/components/pay-invoice-button';

export default function PortalInvoiceRoute() {
  const { invoiceId } = useParams();
  return (
    <>
      <Button component={RouterLink} to={paths.portalInvoices} size="small" startIcon={<ArrowBack />} sx={{ mb: 1 }}>
        Invoices
      </Button>
      <PaymentReturn
        invoiceId={Number(invoiceId)}
        certificate={(jobId) => (
          <JobCertificate jobId={jobId} verifyPath={verifyPath} payInvoice={(id) => <PayInvoiceButton invoiceId={id} label="Pay invoice" />} />
        )}
      />
    </>
  );
}
