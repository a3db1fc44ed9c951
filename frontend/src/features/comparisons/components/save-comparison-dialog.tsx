import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import { useId, useState, type FormEvent } from 'react';
import { FormErrors } from '@/components/ui/form-errors';

type SaveComparisonDialogProps = {
  open: boolean;
  heading: string;
  initialTitle: string;
  initialNotes: string;
  busy: boolean;
  errors: readonly string[];
  onSave: (values: { title: string; notes: string | null }) => void;
  onClose: () => void;
};

export function SaveComparisonDialog({ open, heading, initialTitle, initialNotes, busy, errors, onSave, onClose }: SaveComparisonDialogProps) {
  const titleId = useId();
  const [title, setTitle] = useState(initialTitle);
  const [notes, setNotes] = useState(initialNotes);
  const [missing, setMissing] = useState(false);
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (!title.trim()) {
      setMissing(true);
      return;
    }
    onSave({ title: title.trim(), notes: notes.trim() || null });
  };
  return (
    <Dialog open={open} onClose={busy ? undefined : onClose} aria-labelledby={titleId}>
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>{heading}</DialogTitle>
        <DialogContent>
          <FormErrors messages={errors} />
          <Stack spacing={2} sx={{ pt: 1 }}>
            <TextField
              label="Title"
              required
              autoFocus
              value={title}
              onChange={(e) => {
                setTitle(e.target.value);
                setMissing(false);
              }}
              error={missing}
              helperText={missing ? 'Give the comparison a title' : 'e.g. “VFO warm-up before and after the new regulator”'}
            />
            <TextField
              label="Notes"
              multiline
              minRows={4}
              value={notes}
              onChange={(e) => setNotes(e.target.value)}
              helperText="What changed between the runs, and anything a reader should know"
            />
          </Stack>
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose} disabled={busy}>
            Cancel
          </Button>
          <Button type="submit" variant="contained" disabled={busy}>
            {busy ? 'Saving…' : 'Save'}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
