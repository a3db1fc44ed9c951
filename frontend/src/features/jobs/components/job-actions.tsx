import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useState, type ReactNode } from 'react';
import { jobTransitionRefusal } from '@kilocycle/common/rules';
import type { Job, Role } from '@kilocycle/common/types';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { FormErrors } from '@/components/ui/form-errors';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { submitJobSchema, useSubmitJob } from '../api/submit-job';
import { useUpdateJob } from '../api/update-job';

function messagesOf(error: unknown) {
  return error instanceof ApiError ? error.messages : error ? ['That did not work. Try again.'] : [];
}

type JobActionsProps = {
  job: Job;
  role: Role;
  /** Shown to a lead while the job is in review: where the review is done. */
  reviewLink?: ReactNode;
};

/** The status moves open to this person now, as the API allows them; the rest is explained, not hidden. */
export function JobActions({ job, role, reviewLink }: JobActionsProps) {
  const [submitting, setSubmitting] = useState(false);
  const form = useZodForm(submitJobSchema, { comment: '' });
  const update = useUpdateJob({ onSuccess: (j) => notify('success', `Job ${j.number} is in progress.`) });
  const submit = useSubmitJob({
    onSuccess: () => {
      notify('success', `Job ${job.number} submitted for review.`);
      setSubmitting(false);
    },
  });
  const mayMoveTo = (to: Job['status']) => jobTransitionRefusal(job.status, to, role) === null;

  let actions: ReactNode = null;
  let note: ReactNode = null;
  if (role === 'client') {
    note = null;
  } else if (mayMoveTo('in_progress')) {
    actions = (
      <>
        <Button variant="outlined" disabled={update.isPending} onClick={() => update.mutate({ id: job.id, changes: { status: 'in_progress' } })}>
          {job.status === 'received' ? 'Start work' : 'Back to work'}
        </Button>
        {job.status === 'returned' && (
          <Button variant="contained" onClick={() => setSubmitting(true)}>
            Submit for review
          </Button>
        )}
      </>
    );
  } else if (mayMoveTo('in_review')) {
    actions = (
      <Button variant="contained" onClick={() => setSubmitting(true)}>
        Submit for review
      </Button>
    );
  } else if (job.status === 'in_review') {
    note = role === 'lead' ? <>Waiting for your review. {reviewLink}</> : 'Waiting for the lead’s review; its runs take no more readings until then.';
  } else if (job.status === 'approved') {
    note = 'Approved. The job is issued when its certificate is signed.';
  } else if (job.status === 'issued') {
    note = 'Issued: the record is closed.';
  }

  return (
    <Box>
      {job.status === 'returned' && job.returnComment && (
        <Alert severity="warning" sx={{ mb: 1 }}>
          Returned for rework: {job.returnComment}
        </Alert>
      )}
      <FormErrors messages={messagesOf(update.error)} />
      <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }}>
        {actions}
        {note && (
          <Box component="span" sx={{ color: 'text.secondary', fontSize: '0.875rem' }}>
            {note}
          </Box>
        )}
      </Box>
      <FormDialog
        open={submitting}
        title={`Submit job ${job.number} for review?`}
        intro="The lead reviews the readings, fits and budget. Until the job comes back, its runs take no more readings."
        form={form}
        onSubmit={(body) => submit.mutate({ id: job.id, body })}
        onClose={() => setSubmitting(false)}
        onExited={() => submit.reset()}
        pending={submit.isPending}
        error={submit.error}
        errorFallback="That did not work. Try again."
        submitLabel="Submit for review"
        pendingLabel="Submitting…"
      >
        <FormTextField control={form.control} name="comment" label="Note for the lead (optional)" multiline minRows={2} />
      </FormDialog>
    </Box>
  );
}
