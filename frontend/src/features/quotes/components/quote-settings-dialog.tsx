import type { Quote } from '@kilocycle/common/types';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { numberSx } from '@/components/ui/num';
import { quoteSettingsSchema, useUpdateQuote } from '../api/update-quote';

type QuoteSettingsDialogProps = { quote: Quote; open: boolean; onClose: () => void };

/** A draft's validity in days and its notes to the customer. */
export function QuoteSettingsDialog({ quote, open, onClose }: QuoteSettingsDialogProps) {
  const current = { validityDays: String(quote.validityDays), notes: quote.notes ?? '' };
  const form = useZodForm(quoteSettingsSchema, current, current);
  const update = useUpdateQuote({ onSuccess: onClose });
  return (
    <FormDialog
      open={open}
      title={`Quote ${quote.number}`}
      form={form}
      onSubmit={(changes) => update.mutate({ id: quote.id, changes })}
      onClose={onClose}
      onExited={() => update.reset()}
      pending={update.isPending}
      error={update.error}
      errorFallback="The quote could not be saved."
      submitLabel="Save"
      pendingLabel="Saving…"
    >
      <FormTextField
        control={form.control}
        name="validityDays"
        label="Valid for (days)"
        required
        helperText="Counted from the day it is sent"
        slotProps={{ htmlInput: { inputMode: 'numeric', style: { fontFamily: numberSx.fontFamily } } }}
      />
      <FormTextField control={form.control} name="notes" label="Notes to the customer" multiline minRows={2} helperText="Printed under the lines" />
    </FormDialog>
  );
}
