import type { AcceptanceChannel, Quote } from '@kilocycle/common/types';
import { FormDialog, FormRadioGroup, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { notify } from '@/lib/notifications';
import { recordAcceptanceSchema, RECORDED_CHANNELS, useAcceptQuote } from '../api/accept-quote';

export const CHANNEL_LABELS: Record<AcceptanceChannel, string> = { portal: 'In the portal', phone: 'By phone', email: 'By e-mail', in_person: 'In person' };

type RecordAcceptanceDialogProps = { quote: Quote | null; onClose: () => void };

/** The lab records that the customer accepted a sent quote by phone, e-mail or in person, with a note. */
export function RecordAcceptanceDialog({ quote, onClose }: RecordAcceptanceDialogProps) {
  const form = useZodForm(recordAcceptanceSchema, { channel: 'phone', note: '' });
  const accept = useAcceptQuote({
    onSuccess: (accepted) => {
      notify('success', `Quote ${accepted.number} recorded as accepted.`);
      onClose();
    },
  });
  return (
    <FormDialog
      open={quote !== null}
      title={quote ? `Record acceptance of ${quote.number}` : 'Record acceptance'}
      intro="For a customer who accepted outside the portal. The note is kept with the quote and in the audit log."
      form={form}
      onSubmit={(body) => quote && accept.mutate({ id: quote.id, ...body })}
      onClose={onClose}
      onExited={() => accept.reset()}
      pending={accept.isPending}
      error={accept.error}
      errorFallback="The acceptance could not be recorded."
      submitLabel="Record acceptance"
      pendingLabel="Recording…"
    >
      <FormRadioGroup control={form.control} name="channel" label="Accepted" options={RECORDED_CHANNELS.map((c) => ({ value: c, label: CHANNEL_LABELS[c] }))} />
      <FormTextField
        control={form.control}
        name="note"
        label="Note"
        required
        multiline
        minRows={2}
        helperText="Who accepted, when, and anything they asked for"
      />
    </FormDialog>
  );
}
