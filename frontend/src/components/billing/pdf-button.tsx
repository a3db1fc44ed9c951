import PictureAsPdfOutlined from '@mui/icons-material/PictureAsPdfOutlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';

type PdfButtonProps = {
  /** Fetches the PDF with the session's token and hands it to the browser. */
  download: () => Promise<void>;
  /** The accessible name, holding the visible word: e.g. "Download quote Q-000004 as PDF". */
  ariaLabel: string;
  label?: string;
};

/** A quote's, invoice's or credit note's stored PDF; a refusal goes to the snackbar in the server's words. */
export function PdfButton({ download, ariaLabel, label = 'PDF' }: PdfButtonProps) {
  const [busy, setBusy] = useState(false);
  const run = async () => {
    setBusy(true);
    try {
      await download();
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
      onClick={() => void run()}
      disabled={busy}
      aria-label={ariaLabel}
      sx={{ minWidth: 0 }}
    >
      {busy ? '…' : label}
    </Button>
  );
}
