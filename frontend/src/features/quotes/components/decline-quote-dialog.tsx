import type { Quote } from '@kilocycle/common/types';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { notify } from '@/lib/notifications';
import { declineQuoteSchema, useDeclineQuote } from '../api/decline-quote';

type DeclineQuoteDialogProps = {
  quote: Quote | null;
  onClose: () => void;
  /** The customer declining for itself, or the lab recording it. */ byCustomer: boolean;
};

export function DeclineQuoteDialog({ quote, onClose, byCustomer }: DeclineQuoteDialogProps) {
  const form = useZodForm(declineQuoteSchema, { note: '' });
  const decline = useDeclineQuote({
    onSuccess: (declined) => {
      notify('success', `Quote ${declined.number} declined.`);
      onClose();
    },
  });
  return (
    <FormDialog
      open={quote !== null}
      title={quote ? `Decline quote ${quote.number}?` : 'Decline the quote?'}
      intro={
        byCustomer ? 'The lab is told, and will be in touch about the instrument.' : 'Records that the customer declined. A new quote can be made afterwards.'
      }
      form={form}
      onSubmit={(body) => quote && decline.mutate({ id: quote.id, ...body })}
      onClose={onClose}
      onExited={() => decline.reset()}
      pending={decline.isPending}
      error={decline.error}
      errorFallback="The quote could not be declined."
      submitLabel="Decline"
      pendingLabel="Declining…"
      submitColor="error"
    >
      <FormTextField control={form.control} name="note" label={byCustomer ? 'Anything to tell the lab (optional)' : 'Note (optional)'} multiline minRows={2} />
    </FormDialog>
  );
}
