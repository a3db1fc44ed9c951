import LockOutlined from '@mui/icons-material/LockOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Tooltip from '@mui/material/Tooltip';
import type { ReactNode } from 'react';
import type { CertificateRelease } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';

/** A certificate the server holds back from the client: release reported and not released. */
export function isHeld(release: CertificateRelease | undefined): release is CertificateRelease & { released: false } {
  return release !== undefined && !release.released;
}

/** The slot a page fills with the invoices feature's pay button (features never import each other). */
export type PayInvoiceSlot = (invoiceId: number) => ReactNode;

type HeldCertificateProps = {
  number: string;
  release: CertificateRelease;
  payInvoice?: PayInvoiceSlot;
};

/** Why the client cannot download the certificate yet, and the button that pays the invoice that releases it. */
export function HeldCertificate({ number, release, payInvoice }: HeldCertificateProps) {
  return (
    <Alert
      severity="warning"
      icon={<LockOutlined fontSize="inherit" />}
      aria-label={`Certificate ${number} is held`}
      action={release.invoiceId !== null && payInvoice ? <Box sx={{ alignSelf: 'center' }}>{payInvoice(release.invoiceId)}</Box> : undefined}
      sx={{ alignItems: 'center', flexWrap: 'wrap' }}
    >
      Certificate <Num>{number}</Num>: {release.heldReason ?? 'held until the invoice for this job is paid.'}
    </Alert>
  );
}

/** In a list's action cell, in place of the PDF button: "Held", with the reason on hover and for screen readers. */
export function HeldChip({ number, release }: { number: string; release: CertificateRelease }) {
  const reason = release.heldReason ?? 'Held until the invoice for this job is paid.';
  return (
    <Tooltip title={reason}>
      <Chip
        size="small"
        icon={<LockOutlined fontSize="small" />}
        label="Held"
        variant="outlined"
        color="warning"
        aria-label={`Held: ${number}. ${reason}`}
        sx={{ height: 22 }}
      />
    </Tooltip>
  );
}
