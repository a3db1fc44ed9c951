import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useId, useState, type FormEvent } from 'react';
import { FormErrors } from '@/components/ui/form-errors';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { MIN_RETURN_COMMENT, useReturnJob } from '../api/return-job';

type ReturnDialogProps = { open: boolean; jobId: number; jobNumber: string; technician: string | null; onClose: () => void };

/** Sends a job back for rework: the comment is required and goes to the technician by mail. */
export function ReturnDialog({ open, jobId, jobNumber, technician, onClose }: ReturnDialogProps) {
  const titleId = useId();
  const [comment, setComment] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const returnJob = useReturnJob({
    onSuccess: () => {
      notify('success', `Job ${jobNumber} returned to ${technician ?? 'the technician'}.`);
      setComment('');
      onClose();
    },
  });

  const close = () => {
    if (returnJob.isPending) return;
    setProblem(null);
    returnJob.reset();
    onClose();
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const text = comment.trim();
    if (text.length < MIN_RETURN_COMMENT) {
      setProblem('Say what needs rework');
      return;
    }
    returnJob.mutate({ jobId, comment: text });
  };

  const messages = returnJob.error ? (returnJob.error instanceof ApiError ? returnJob.error.messages : ['The job could not be returned.']) : [];

  return (
    <Dialog open={open} onClose={close} aria-labelledby={titleId}>
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>Return with comments</DialogTitle>
        <DialogContent>
          <FormErrors messages={messages} />
          <Typography variant="body2" sx={{ mb: 1.5 }}>
            Job {jobNumber} goes back to {technician ?? 'the technician'} for rework, who is mailed your comments.
          </Typography>
          <TextField
            label="Comments"
            multiline
            minRows={4}
            required
            autoFocus
            value={comment}
            onChange={(e) => {
              setComment(e.target.value);
              setProblem(null);
            }}
            error={problem !== null}
            helperText={problem ?? 'What to measure again, correct or explain'}
            disabled={returnJob.isPending}
          />
        </DialogContent>
        <DialogActions>
          <Button onClick={close} disabled={returnJob.isPending}>
            Cancel
          </Button>
          <Button type="submit" variant="contained" color="warning" disabled={returnJob.isPending}>
            {returnJob.isPending ? 'Returning…' : 'Return job'}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
