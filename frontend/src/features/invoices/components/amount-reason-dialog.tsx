import { moneyEditText } from '@kilocycle/common/money';
import { useMemo, type ReactNode } from 'react';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { numberSx } from '@/components/ui/num';
import { amountAndReasonSchema } from '../api/create-credit-note';

type AmountReasonDialogProps = {
  open: boolean;
  title: string;
  intro: ReactNode;
  currency: string;
  /** The most the form takes, in minor units (the server checks what is left and says so when it refuses). */
  maxMinor: number;
  /** What the amount field starts with, in minor units. */
  suggestedMinor?: number;
  submitLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (body: { amountMinor: number; reason: string }) => void;
  onClose: () => void;
  onExited: () => void;
};

/** An amount of money and the reason for it: a credit note or a refund. */
export function AmountReasonDialog(props: AmountReasonDialogProps) {
  const { open, title, intro, currency, maxMinor, suggestedMinor, submitLabel, pending, error, onSubmit, onClose, onExited } = props;
  const schema = useMemo(() => amountAndReasonSchema(currency, maxMinor), [currency, maxMinor]);
  const initial = { amount: suggestedMinor === undefined ? '' : moneyEditText(suggestedMinor, currency), reason: '' };
  const form = useZodForm(schema, initial, initial);
  return (
    <FormDialog
      open={open}
      title={title}
      intro={intro}
      form={form}
      onSubmit={({ amount, reason }) => onSubmit({ amountMinor: amount, reason })}
      onClose={onClose}
      onExited={onExited}
      pending={pending}
      error={error}
      errorFallback="That did not go through. Try again."
      submitLabel={submitLabel}
      pendingLabel="Working…"
    >
      <FormTextField
        control={form.control}
        name="amount"
        label={`Amount (${currency}, tax included)`}
        required
        slotProps={{ htmlInput: { style: { fontFamily: numberSx.fontFamily } } }}
      />
      <FormTextField
        control={form.control}
        name="reason"
        label="Reason"
        required
        multiline
        minRows={2}
        helperText="Printed on the credit note and kept in the audit log"
      />
    </FormDialog>
  );
}
