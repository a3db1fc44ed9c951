import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { comparisonTextSchema } from '../api/save-comparison';

type SaveComparisonDialogProps = {
  open: boolean;
  heading: string;
  initialTitle: string;
  initialNotes: string;
  busy: boolean;
  error: unknown;
  onSave: (values: { title: string; notes: string | null }) => void;
  onClose: () => void;
};

export function SaveComparisonDialog({ open, heading, initialTitle, initialNotes, busy, error, onSave, onClose }: SaveComparisonDialogProps) {
  const form = useZodForm(comparisonTextSchema, { title: initialTitle, notes: initialNotes });
  return (
    <FormDialog
      open={open}
      title={heading}
      form={form}
      onSubmit={onSave}
      onClose={onClose}
      pending={busy}
      error={error}
      errorFallback="The comparison could not be saved."
      submitLabel="Save"
      pendingLabel="Saving…"
    >
      <FormTextField control={form.control} name="title" label="Title" required helperText="e.g. “VFO warm-up before and after the new regulator”" />
      <FormTextField
        control={form.control}
        name="notes"
        label="Notes"
        multiline
        minRows={4}
        helperText="What changed between the runs, and anything a reader should know"
      />
    </FormDialog>
  );
}
