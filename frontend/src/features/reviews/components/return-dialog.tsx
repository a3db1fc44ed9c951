import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { notify } from '@/lib/notifications';
import { returnJobSchema, useReturnJob } from '../api/return-job';

type ReturnDialogProps = { open: boolean; jobId: number; jobNumber: string; technician: string | null; onClose: () => void };

/** Sends a job back for rework: the comment is required and goes to the technician by mail. */
export function ReturnDialog({ open, jobId, jobNumber, technician, onClose }: ReturnDialogProps) {
  const form = useZodForm(returnJobSchema, { comment: '' });
  const returnJob = useReturnJob({
    onSuccess: () => {
      notify('success', `Job ${jobNumber} returned to ${technician ?? 'the technician'}.`);
      onClose();
    },
  });

  return (
    <FormDialog
      open={open}
      title="Return with comments"
      intro={`Job ${jobNumber} goes back to ${technician ?? 'the technician'} for rework, who is mailed your comments.`}
      form={form}
      onSubmit={({ comment }) => returnJob.mutate({ jobId, comment })}
      onClose={onClose}
      onExited={() => returnJob.reset()}
      pending={returnJob.isPending}
      error={returnJob.error}
      errorFallback="The job could not be returned."
      submitLabel="Return job"
      pendingLabel="Returning…"
      submitColor="warning"
    >
      <FormTextField
        control={form.control}
        name="comment"
        label="Comments"
        multiline
        minRows={4}
        required
        helperText="What to measure again, correct or explain"
        disabled={returnJob.isPending}
      />
    </FormDialog>
  );
}
