import FormControlLabel from '@mui/material/FormControlLabel';
import Switch from '@mui/material/Switch';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import type { Certificate } from '@kilocycle/common/types';
import { notify } from '@/lib/notifications';
import { useAmendCertificate } from '../api/amend-certificate';
import { useWithdrawCertificate } from '../api/withdraw-certificate';
import { ReasonDialog } from './reason-dialog';

type CertificateActionsProps = { certificate: Certificate | null; action: 'amend' | 'withdraw' | null; onClose: () => void };

/** The lead's amendments (a new revision) and withdrawals, each with its written reason. */
export function CertificateActions({ certificate, action, onClose }: CertificateActionsProps) {
  const [rework, setRework] = useState(true);
  const amend = useAmendCertificate({
    onSuccess: (draft) => {
      notify(
        'success',
        `Revision ${draft.revision} of ${draft.number} is in preparation; revision ${draft.replacesRevision ?? draft.revision - 1} is superseded. ${
          rework ? 'The job is back with the technician.' : 'The job is in review, ready to sign again.'
        }`,
      );
      close();
    },
  });
  const withdraw = useWithdrawCertificate({
    onSuccess: (c) => {
      notify('success', `Certificate ${c.number} revision ${c.revision} is withdrawn.`);
      close();
    },
  });

  function close() {
    amend.reset();
    withdraw.reset();
    setRework(true);
    onClose();
  }

  if (!certificate) return null;
  const name = `${certificate.number} revision ${certificate.revision}`;
  return (
    <>
      <ReasonDialog
        open={action === 'amend'}
        title={`Amend ${certificate.number}`}
        intro={
          <Typography variant="body2">
            Revision {certificate.revision} is marked superseded at once and stays downloadable. Revision {certificate.revision + 1} is issued when the job is
            signed again and carries “replaces revision {certificate.revision}”.
          </Typography>
        }
        reasonLabel="Reason for the amendment"
        confirmLabel={amend.isPending ? 'Reopening…' : 'Open a new revision'}
        busy={amend.isPending}
        error={amend.error}
        extra={
          <FormControlLabel
            control={<Switch checked={rework} onChange={(e) => setRework(e.target.checked)} />}
            label={rework ? 'The job goes back to the technician for rework' : 'Straight back to review (no new measurements)'}
          />
        }
        onConfirm={(reason) => amend.mutate({ id: certificate.id, reason, rework })}
        onClose={close}
      />
      <ReasonDialog
        open={action === 'withdraw'}
        title={`Withdraw ${name}?`}
        intro={
          <Typography variant="body2">
            The verification page will show this certificate as withdrawn, with no replacement. Use an amendment instead if a corrected revision is to follow.
          </Typography>
        }
        reasonLabel="Reason for withdrawal"
        confirmLabel={withdraw.isPending ? 'Withdrawing…' : 'Withdraw certificate'}
        destructive
        busy={withdraw.isPending}
        error={withdraw.error}
        onConfirm={(reason) => withdraw.mutate({ id: certificate.id, reason })}
        onClose={close}
      />
    </>
  );
}
