import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import VerifiedOutlined from '@mui/icons-material/VerifiedOutlined';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import { useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { Certificate } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { ApiError } from '@/lib/api-client';
import { downloadFile } from '@/lib/file-transfer';
import { notify } from '@/lib/notifications';
import { formatDateTime } from '@/utils/format';

type CertificateIssuedProps = { certificate: Pick<Certificate, 'number' | 'revision' | 'pdfUrl' | 'issuedAt' | 'signedByName' | 'status'>; fresh?: boolean };

/** The issued certificate of a job: its number, who signed it, and its PDF. */
export function CertificateIssued({ certificate, fresh }: CertificateIssuedProps) {
  const [busy, setBusy] = useState(false);
  const fileName = `${certificate.number}-rev${certificate.revision}.pdf`;
  const download = async () => {
    if (!certificate.pdfUrl) return;
    setBusy(true);
    try {
      await downloadFile(certificate.pdfUrl, fileName);
    } catch (error) {
      notify('error', error instanceof ApiError ? error.message : 'The PDF could not be downloaded.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Alert severity="success" icon={<VerifiedOutlined />} sx={{ mb: 2 }} role="status">
      <AlertTitle>
        {fresh ? 'Signed. Certificate ' : 'Certificate '}
        <Num sx={{ fontWeight: 600 }}>
          <span data-testid="certificate-number">{certificate.number}</span>
        </Num>{' '}
        revision {certificate.revision} {certificate.status === 'issued' ? 'is issued' : `is ${certificate.status}`}
      </AlertTitle>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 2, flexWrap: 'wrap' }}>
        <span>
          Signed by {certificate.signedByName ?? '—'} at <Num>{formatDateTime(certificate.issuedAt)}</Num>
          {fresh ? '; the customer has been mailed.' : '.'}
        </span>
        {certificate.pdfUrl && (
          <Button size="small" variant="outlined" color="success" startIcon={<DownloadOutlined />} onClick={() => void download()} disabled={busy}>
            {busy ? 'Downloading…' : `Certificate PDF (${fileName})`}
          </Button>
        )}
        <Link component={RouterLink} to={`/verify/${encodeURIComponent(certificate.number)}`}>
          Public verification page
        </Link>
      </Box>
    </Alert>
  );
}
