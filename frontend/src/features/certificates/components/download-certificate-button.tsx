import PictureAsPdfOutlined from '@mui/icons-material/PictureAsPdfOutlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import type { Certificate } from '@kilocycle/common/types';
import { ApiError } from '@/lib/api-client';
import { downloadFile } from '@/lib/file-transfer';
import { notify } from '@/lib/notifications';
import { HeldChip, isHeld } from './held-certificate';

type DownloadCertificateButtonProps = { certificate: Pick<Certificate, 'number' | 'revision' | 'pdfUrl' | 'release'>; label?: string };

/**
 * The stored PDF, fetched with the session's token (the file URL is behind sign-in) and saved; for a client whose
 * certificate the server holds until an invoice is paid, "Held" with the reason instead.
 */
export function DownloadCertificateButton({ certificate, label = 'PDF' }: DownloadCertificateButtonProps) {
  const [busy, setBusy] = useState(false);
  if (!certificate.pdfUrl) return null;
  if (isHeld(certificate.release)) return <HeldChip number={certificate.number} release={certificate.release} />;
  const pdfUrl = certificate.pdfUrl;
  const fileName = `${certificate.number}-rev${certificate.revision}.pdf`;
  const download = async () => {
    setBusy(true);
    try {
      await downloadFile(pdfUrl, fileName);
    } catch (error) {
      notify('error', error instanceof ApiError ? `The PDF could not be downloaded: ${error.message}` : 'The PDF could not be downloaded.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Button
      size="small"
      startIcon={<PictureAsPdfOutlined fontSize="small" />}
      onClick={() => void download()}
      disabled={busy}
      aria-label={`Download ${certificate.number} revision ${certificate.revision} as PDF`}
      // As narrow as its icon and word, so it keeps its place in a list on a phone.
      sx={{ minWidth: 0 }}
    >
      {busy ? '…' : label}
    </Button>
  );
}
