import Alert from '@mui/material/Alert';
import Typography from '@mui/material/Typography';
import { SIGNING_MEANING, type CertificateDetail } from '@kilocycle/common/types';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { ROLE_LABELS } from '@/config/roles';
import { useCurrentUser } from '@/lib/auth';
import { signJobSchema, useSignJob } from '../api/sign-job';

type SignDialogProps = {
  open: boolean;
  jobId: number;
  jobNumber: string;
  customer: string;
  instrument: string;
  onClose: () => void;
  onSigned: (certificate: CertificateDetail) => void;
};

/**
 * The electronic signature: the lead types the password again and agrees to the stated meaning. A refused
 * password keeps the dialog open with the server's words; the session is left alone.
 */
export function SignDialog({ open, jobId, jobNumber, customer, instrument, onClose, onSigned }: SignDialogProps) {
  const user = useCurrentUser();
  const form = useZodForm(signJobSchema, { password: '' });
  const sign = useSignJob({ onSuccess: onSigned });

  const intro = (
    <>
      <Typography variant="body2" color="text.primary" sx={{ mb: 1.5 }}>
        Job <strong>{jobNumber}</strong> for {customer}: {instrument}.
      </Typography>
      <Alert severity="info" icon={false} role="note">
        <Typography variant="body2" color="text.secondary">
          Meaning of this signature
        </Typography>
        <Typography sx={{ fontWeight: 600 }} data-testid="signing-meaning">
          {SIGNING_MEANING.charAt(0).toUpperCase() + SIGNING_MEANING.slice(1)}
        </Typography>
        <Typography variant="body2" sx={{ mt: 0.5 }}>
          Signed by {user.name}, {ROLE_LABELS[user.role].toLowerCase()}, at the time you confirm. The certificate PDF is made once, stored with its hash, and
          mailed to the customer. The job’s runs, readings and budgets cannot be changed afterwards; a correction is a new revision.
        </Typography>
      </Alert>
    </>
  );

  return (
    <FormDialog
      open={open}
      title="Sign and issue the certificate"
      intro={intro}
      form={form}
      onSubmit={({ password }) => sign.mutate({ jobId, password })}
      onClose={onClose}
      onExited={() => sign.reset()}
      pending={sign.isPending}
      error={sign.error}
      errorFallback="The job could not be signed. Try again."
      submitLabel="Sign and issue"
      pendingLabel="Signing…"
    >
      <FormTextField
        control={form.control}
        name="password"
        label="Your password"
        type="password"
        autoComplete="current-password"
        required
        helperText="Typed again to confirm that you are signing"
        disabled={sign.isPending}
      />
    </FormDialog>
  );
}
