import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import { useId, useState, type FormEvent, type ReactNode } from 'react';
import { FormErrors } from '@/components/ui/form-errors';

type ReasonDialogProps = {
  open: boolean;
  title: string;
  intro: ReactNode;
  reasonLabel: string;
  confirmLabel: string;
  destructive?: boolean;
  busy: boolean;
  errors: readonly string[];
  extra?: ReactNode;
  onConfirm: (reason: string) => void;
  onClose: () => void;
};

/** A decision that must be explained in writing (kept with the record and in the audit log). */
export function ReasonDialog({ open, title, intro, reasonLabel, confirmLabel, destructive, busy, errors, extra, onConfirm, onClose }: ReasonDialogProps) {
  const titleId = useId();
  const [reason, setReason] = useState('');
  const [missing, setMissing] = useState(false);
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (reason.trim().length < 3) {
      setMissing(true);
      return;
    }
    onConfirm(reason.trim());
  };
  const close = () => {
    if (busy) return;
    setReason('');
    setMissing(false);
    onClose();
  };
  return (
    <Dialog open={open} onClose={close} aria-labelledby={titleId}>
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>{title}</DialogTitle>
        <DialogContent>
          <FormErrors messages={errors} />
          {intro}
          <TextField
            label={reasonLabel}
            multiline
            minRows={3}
            required
            autoFocus
            value={reason}
            onChange={(e) => {
              setReason(e.target.value);
              setMissing(false);
            }}
            error={missing}
            helperText={missing ? 'Give the reason in a few words' : 'Kept with the certificate and in the audit log'}
            disabled={busy}
            sx={{ mt: 2 }}
          />
          {extra}
        </DialogContent>
        <DialogActions>
          <Button onClick={close} disabled={busy}>
            Cancel
          </Button>
          <Button type="submit" variant="contained" color={destructive ? 'error' : 'primary'} disabled={busy}>
            {confirmLabel}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
