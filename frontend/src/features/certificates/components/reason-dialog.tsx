import type { ReactNode } from 'react';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { certificateReasonSchema } from '../api/amend-certificate';

type ReasonDialogProps = {
  open: boolean;
  title: string;
  intro: ReactNode;
  reasonLabel: string;
  confirmLabel: string;
  destructive?: boolean;
  busy: boolean;
  error: unknown;
  extra?: ReactNode;
  onConfirm: (reason: string) => void;
  onClose: () => void;
};

/** A decision that must be explained in writing (kept with the record and in the audit log). */
export function ReasonDialog({ open, title, intro, reasonLabel, confirmLabel, destructive, busy, error, extra, onConfirm, onClose }: ReasonDialogProps) {
  const form = useZodForm(certificateReasonSchema, { reason: '' });
  return (
    <FormDialog
      open={open}
      title={title}
      intro={intro}
      form={form}
      onSubmit={({ reason }) => onConfirm(reason)}
      onClose={onClose}
      pending={busy}
      error={error}
      errorFallback="That did not work. Try again."
      submitLabel={confirmLabel}
      pendingLabel={confirmLabel}
      submitColor={destructive ? 'error' : 'primary'}
    >
      <FormTextField
        control={form.control}
        name="reason"
        label={reasonLabel}
        multiline
        minRows={3}
        required
        helperText="Kept with the certificate and in the audit log"
        disabled={busy}
      />
      {extra}
    </FormDialog>
  );
}
