import CancelOutlined from '@mui/icons-material/CancelOutlined';
import CheckCircleOutlined from '@mui/icons-material/CheckCircleOutlined';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import type { CertificateCheckResult, CertificateStatus, PublicCertificate } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { ApiError } from '@/lib/api-client';
import { formatDate } from '@/utils/format';
import { useCheckCertificate } from '../api/check-certificate';
import { usePublicCertificate } from '../api/get-public-certificate';
import { PdfDropZone } from './pdf-drop-zone';

const STATUS_WORDS: Record<CertificateStatus, { label: string; severity: 'success' | 'warning' | 'error' | 'info'; text: string }> = {
  issued: { label: 'Valid', severity: 'success', text: 'This is the current revision of the certificate.' },
  superseded: { label: 'Superseded', severity: 'warning', text: 'A later revision replaces this one.' },
  withdrawn: { label: 'Withdrawn', severity: 'error', text: 'The laboratory has withdrawn this certificate; it should not be relied on.' },
  draft: { label: 'Not issued', severity: 'info', text: 'This revision has not been issued.' },
};

function CheckOutcome({ number, result, fileName }: { number: string; result: CertificateCheckResult; fileName: string }) {
  if (!result.match) {
    return (
      <Alert severity="error" icon={<CancelOutlined />} role="alert" data-testid="check-result">
        <AlertTitle>Not the issued certificate</AlertTitle>“{fileName}” does not match any issued revision of certificate {number}: its bytes differ from the
        file the laboratory stored when it was signed. It may have been altered, or it may be a different document. Do not rely on it; ask the laboratory for a
        copy.
        <Typography variant="caption" component="div" sx={{ ...numberSx, mt: 1, wordBreak: 'break-all', whiteSpace: 'normal' }}>
          SHA-256 of your file: {result.sha256}
        </Typography>
      </Alert>
    );
  }
  const words = result.status ? STATUS_WORDS[result.status] : null;
  const current = result.status === 'issued';
  return (
    <Alert severity={current ? 'success' : 'warning'} icon={<CheckCircleOutlined />} role="alert" data-testid="check-result">
      <AlertTitle>
        The file matches revision {result.revision} of certificate {number}
      </AlertTitle>
      “{fileName}” is byte for byte the PDF the laboratory issued
      {result.signatureValid === false ? ', but the laboratory’s signature of it did not verify' : ', and the laboratory’s signature of it is valid'}.
      {words && !current && ` That revision is ${words.label.toLowerCase()}: ${words.text}`}
      <Typography variant="caption" component="div" sx={{ ...numberSx, mt: 1, wordBreak: 'break-all', whiteSpace: 'normal' }}>
        SHA-256: {result.sha256}
      </Typography>
    </Alert>
  );
}

type CheckedFile = { result: CertificateCheckResult; fileName: string };

/**
 * The banner at the top: the certificate's own status until a file is checked, then what matters to the person
 * holding that file (a valid certificate says nothing about a copy that differs from it).
 */
function StatusBanner({ certificate, checked }: { certificate: PublicCertificate; checked: CheckedFile | null }) {
  const words = STATUS_WORDS[certificate.status];
  let severity = words.severity;
  let title = `${words.label}: certificate ${certificate.number}, revision ${certificate.revision}`;
  let text = words.text;
  if (checked && !checked.result.match) {
    severity = 'error';
    title = `Your file is not the issued certificate ${certificate.number}`;
    text = `“${checked.fileName}” differs from every revision the laboratory issued, so do not rely on it. The laboratory’s own record of revision ${certificate.revision} is ${words.label.toLowerCase()}.`;
  } else if (checked && checked.result.signatureValid === false) {
    severity = 'error';
    title = `Your file matches revision ${checked.result.revision}, but its signature did not verify`;
    text = 'Ask the laboratory to confirm this certificate before relying on it.';
  } else if (checked && checked.result.status) {
    const revisionWords = STATUS_WORDS[checked.result.status];
    severity = revisionWords.severity;
    title = `${revisionWords.label}: your file is certificate ${certificate.number}, revision ${checked.result.revision}`;
    text = revisionWords.text;
  }
  return (
    <Alert severity={severity} variant="filled" sx={{ mb: 2 }} data-testid="certificate-status">
      <AlertTitle sx={{ mb: 0 }}>{title}</AlertTitle>
      {text}
    </Alert>
  );
}

function Details({ certificate, checked }: { certificate: PublicCertificate; checked: CheckedFile | null }) {
  const words = STATUS_WORDS[certificate.status];
  return (
    <>
      <StatusBanner certificate={certificate} checked={checked} />
      <Paper variant="outlined" sx={{ p: 2.5, mb: 2 }}>
        <Box
          component="dl"
          sx={{
            display: 'grid',
            gridTemplateColumns: 'max-content 1fr',
            columnGap: 3,
            rowGap: 0.75,
            m: 0,
            '& dt': { color: 'text.secondary' },
            '& dd': { m: 0 },
          }}
        >
          <dt>Certificate</dt>
          <dd>
            <Box component="span" sx={numberSx}>
              {certificate.number}
            </Box>
          </dd>
          <dt>Revision</dt>
          <dd>{certificate.revision}</dd>
          <dt>Status</dt>
          <dd>{words.label}</dd>
          <dt>Instrument</dt>
          <dd>{certificate.instrument}</dd>
          <dt>Customer</dt>
          <dd>{certificate.customer}</dd>
          <dt>Issued</dt>
          <dd>
            <Box component="span" sx={numberSx}>
              {formatDate(certificate.issuedAt)}
            </Box>
          </dd>
        </Box>
        {certificate.revisions.length > 1 && (
          <Box sx={{ mt: 2 }}>
            <Typography variant="h4" component="h2" sx={{ mb: 0.5 }}>
              Revisions
            </Typography>
            <Table size="small" aria-label="Revisions">
              <TableHead>
                <TableRow>
                  <TableCell>Revision</TableCell>
                  <TableCell>Status</TableCell>
                  <TableCell>Issued</TableCell>
                </TableRow>
              </TableHead>
              <TableBody>
                {certificate.revisions.map((r) => (
                  <TableRow key={r.revision}>
                    <TableCell sx={numberSx}>{r.revision}</TableCell>
                    <TableCell>{STATUS_WORDS[r.status].label}</TableCell>
                    <TableCell sx={numberSx}>{formatDate(r.issuedAt)}</TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </Box>
        )}
      </Paper>
    </>
  );
}

type CertificateVerificationProps = { number: string; onOtherNumber: () => void };

/** The public answer for one certificate number, and the byte-for-byte check of a PDF someone holds. */
export function CertificateVerification({ number, onOtherNumber }: CertificateVerificationProps) {
  const certificate = usePublicCertificate(number);
  const check = useCheckCertificate();
  const [fileName, setFileName] = useState('');

  const onFile = (file: File) => {
    setFileName(file.name);
    check.mutate({ number, file });
  };

  if (certificate.isPending) {
    return (
      <Box sx={{ display: 'flex', gap: 1.5, alignItems: 'center' }} role="status">
        <CircularProgress size={20} /> Looking up certificate {number}…
      </Box>
    );
  }
  if (certificate.isError) {
    const notFound = certificate.error instanceof ApiError && certificate.error.status === 404;
    return (
      <Alert severity="error" action={<Button onClick={onOtherNumber}>Another number</Button>}>
        <AlertTitle>{notFound ? `No certificate numbered ${number}` : 'The certificate could not be looked up'}</AlertTitle>
        {notFound
          ? 'Check the number against the top of the certificate’s pages. A certificate that is not found here was not issued by this laboratory.'
          : certificate.error.message}
      </Alert>
    );
  }

  const checkError = check.error instanceof ApiError ? check.error.message : check.error ? 'The file could not be checked.' : null;

  return (
    <Box>
      <Typography variant="h1" sx={{ mb: 2 }}>
        Certificate {certificate.data.number}
      </Typography>
      <Details certificate={certificate.data} checked={check.data && !check.isPending ? { result: check.data, fileName } : null} />
      <Paper variant="outlined" sx={{ p: 2.5, mb: 2 }}>
        <Typography variant="h2" sx={{ mb: 0.5 }}>
          Is your copy the issued one?
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
          Choose the PDF you were given. It is compared byte for byte with the file the laboratory stored when the certificate was signed; any change at all,
          even one character, makes it differ.
        </Typography>
        <PdfDropZone onFile={onFile} disabled={check.isPending} label="Certificate PDF to check" />
        <Box sx={{ mt: 2 }} aria-live="polite">
          {check.isPending && (
            <Box sx={{ display: 'flex', gap: 1.5, alignItems: 'center' }}>
              <CircularProgress size={18} /> Checking “{fileName}”…
            </Box>
          )}
          {check.data && <CheckOutcome number={certificate.data.number} result={check.data} fileName={fileName} />}
          {checkError && (
            <Alert severity="error" role="alert">
              {checkError}
            </Alert>
          )}
        </Box>
      </Paper>
      <Button onClick={onOtherNumber}>Verify another certificate</Button>
    </Box>
  );
}
