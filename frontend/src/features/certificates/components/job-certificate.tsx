import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router-dom';
import { Num } from '@/components/ui/num';
import { formatDate } from '@/utils/format';
import { useCertificates } from '../api/get-certificates';
import { DownloadCertificateButton } from './download-certificate-button';
import { HeldCertificate, isHeld, type PayInvoiceSlot } from './held-certificate';

type JobCertificateProps = { jobId: number; verifyPath: (number: string) => string; payInvoice?: PayInvoiceSlot };

/** A job's issued certificate: its PDF, or why it is still held and the button that pays. */
export function JobCertificate({ jobId, verifyPath, payInvoice }: JobCertificateProps) {
  const certificates = useCertificates({ query: { jobId, status: 'issued', sort: '-revision', pageSize: 1 } });
  if (certificates.isPending) return <Typography color="text.secondary">Loading…</Typography>;
  const certificate = certificates.data?.items[0];
  if (!certificate)
    return (
      <Typography variant="body2" color="text.secondary">
        {certificates.isError ? 'The certificate could not be loaded.' : 'No certificate is issued for this job yet.'}
      </Typography>
    );
  if (isHeld(certificate.release)) return <HeldCertificate number={certificate.number} release={certificate.release} payInvoice={payInvoice} />;
  return (
    <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5, flexWrap: 'wrap' }}>
      <Typography variant="body2" component="span">
        Certificate{' '}
        <Link component={RouterLink} to={verifyPath(certificate.number)}>
          <Num>{certificate.number}</Num>
        </Link>
        , issued <Num>{formatDate(certificate.issuedAt)}</Num>
      </Typography>
      <DownloadCertificateButton certificate={certificate} label="Download the PDF" />
    </Box>
  );
}
