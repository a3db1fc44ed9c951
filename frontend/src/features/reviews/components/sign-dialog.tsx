import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useId, useState, type FormEvent } from 'react';
import { SIGNING_MEANING, type CertificateDetail } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import { ROLE_LABELS } from '@/config/roles';
import { ApiError } from '@/lib/api-client';
import { useCurrentUser } from '@/lib/auth';
import { useSignJob } from '../api/sign-job';

type SignDialogProps = {
  open: boolean;
  jobId: number;
  jobNumber: string;
  customer: string;
  instrument: string;
  onClose: () => void;
  onSigned: (certificate: CertificateDetail) => void;
};

function messagesOf(error: unknown): string[] {
  if (!error) return [];
  if (error instanceof ApiError) return error.messages;
  return ['The job could not be signed. Try again.'];
}

/**
 * The electronic signature: the lead types the password again and agrees to the stated meaning. A refused
 * password keeps the dialog open with the server's words; the session is left alone.
 */
export function SignDialog({ open, jobId, jobNumber, customer, instrument, onClose, onSigned }: SignDialogProps) {
  const titleId = useId();
  const user = useCurrentUser();
  const [password, setPassword] = useState('');
  const [missing, setMissing] = useState(false);
  const sign = useSignJob({
    onSuccess: (certificate) => {
      setPassword('');
      onSigned(certificate);
    },
  });

  const close = () => {
    if (sign.isPending) return;
    setPassword('');
    setMissing(false);
    sign.reset();
    onClose();
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (!password) {
      setMissing(true);
      return;
    }
    sign.mutate({ jobId, password });
  };

  return (
    <Dialog open={open} onClose={close} aria-labelledby={titleId}>
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>Sign and issue the certificate</DialogTitle>
        <DialogContent>
          <FormErrors messages={messagesOf(sign.error)} />
          <Typography variant="body2" sx={{ mb: 1.5 }}>
            Job <strong>{jobNumber}</strong> for {customer}: {instrument}.
          </Typography>
          <Alert severity="info" icon={false} role="note" sx={{ mb: 2 }}>
            <Typography variant="body2" color="text.secondary">
              Meaning of this signature
            </Typography>
            <Typography sx={{ fontWeight: 600 }} data-testid="signing-meaning">
              {SIGNING_MEANING.charAt(0).toUpperCase() + SIGNING_MEANING.slice(1)}
            </Typography>
            <Typography variant="body2" sx={{ mt: 0.5 }}>
              Signed by {user.name}, {ROLE_LABELS[user.role].toLowerCase()}, at the time you confirm. The certificate PDF is made
              once, stored with its hash, and mailed to the customer. The job’s runs, readings and budgets cannot be changed
              afterwards; a correction is a new revision.
            </Typography>
          </Alert>
          <Box>
            <TextField
              label="Your password"
              type="password"
              autoComplete="current-password"
              autoFocus
              required
              value={password}
              onChange={(e) => {
                setPassword(e.target.value);
                setMissing(false);
              }}
              error={missing}
              helperText={missing ? 'Enter your password to sign' : 'Typed again to confirm that you are signing'}
              disabled={sign.isPending}
            />
          </Box>
        </DialogContent>
        <DialogActions>
          <Button onClick={close} disabled={sign.isPending}>
            Cancel
          </Button>
          <Button type="submit" variant="contained" disabled={sign.isPending}>
            {sign.isPending ? 'Signing…' : 'Sign and issue'}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
