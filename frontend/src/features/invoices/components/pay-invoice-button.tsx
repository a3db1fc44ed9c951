import CreditCardOutlined from '@mui/icons-material/CreditCardOutlined';
import Button from '@mui/material/Button';
import { ApiError } from '@/lib/api-client';
import { leaveFor } from '@/lib/navigator';
import { notify } from '@/lib/notifications';
import { usePayInvoice } from '../api/pay-invoice';

type PayInvoiceButtonProps = {
  invoiceId: number;
  /** What the invoice is called in the accessible name, e.g. "INV-000012". */
  invoiceNumber?: string | null;
  label?: string;
  size?: 'small' | 'medium';
};

/** Starts a card payment of what is owed and takes the client to the payment service's page. */
export function PayInvoiceButton({ invoiceId, invoiceNumber, label = 'Pay by card', size = 'small' }: PayInvoiceButtonProps) {
  const pay = usePayInvoice({
    onSuccess: ({ url }) => leaveFor(url),
  });
  const leaving = pay.isPending || pay.isSuccess;
  const text = leaving ? 'Opening the payment page…' : label;
  return (
    <Button
      variant="contained"
      size={size}
      startIcon={<CreditCardOutlined fontSize="small" />}
      disabled={leaving}
      aria-label={invoiceNumber ? `${text} (invoice ${invoiceNumber})` : undefined}
      onClick={() =>
        pay.mutate(invoiceId, {
          onError: (error) => notify('error', error instanceof ApiError ? error.message : 'The payment could not be started. Try again.'),
        })
      }
    >
      {text}
    </Button>
  );
}
