import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import type { JobStatus } from '@kilocycle/common/types';
import { ErrorBoundary } from '@/components/errors/error-boundary';
import { numberSx } from '@/components/ui/num';
import { HIDE_ON_PHONE, PhoneSecondLine } from '@/components/ui/phone-columns';
import { useCurrentUser } from '@/lib/auth';
import { formatDate } from '@/utils/format';
import { usePortalInstruments } from '../api/get-portal-instruments';
import { usePortalJobs } from '../api/get-portal-jobs';

// The customer's words for where a job stands; the lab's internal steps are not their concern.
const JOB_STATUS_WORDS: Record<JobStatus, { label: string; color: 'default' | 'info' | 'warning' | 'success' }> = {
  received: { label: 'Received', color: 'default' },
  in_progress: { label: 'Being calibrated', color: 'info' },
  in_review: { label: 'Being checked', color: 'info' },
  returned: { label: 'Being calibrated', color: 'info' },
  approved: { label: 'Approved', color: 'success' },
  issued: { label: 'Certificate issued', color: 'success' },
};

function daysUntil(date: string): number {
  const [y = 1970, m = 1, d = 1] = date.slice(0, 10).split('-').map(Number);
  const now = new Date();
  return Math.round((Date.UTC(y, m - 1, d) - Date.UTC(now.getFullYear(), now.getMonth(), now.getDate())) / 86_400_000);
}

function Due({ date }: { date: string | null }) {
  if (!date) return <>—</>;
  const days = daysUntil(date);
  const note = days < 0 ? `overdue by ${-days} d` : days <= 30 ? `due in ${days} d` : null;
  return (
    <Box component="span" sx={{ display: 'inline-flex', flexWrap: 'wrap', gap: 0.5, columnGap: 1, alignItems: 'center' }}>
      <Box component="span" sx={numberSx}>
        {formatDate(date)}
      </Box>
      {note && <Chip size="small" color={days < 0 ? 'error' : 'warning'} variant={days < 0 ? 'filled' : 'outlined'} label={note} sx={{ height: 20 }} />}
    </Box>
  );
}

function Section({ title, label, children }: { title: string; label: string; children: ReactNode }) {
  return (
    <Paper variant="outlined" component="section" aria-label={label} sx={{ p: 2, mb: 2 }}>
      <Typography variant="h2" sx={{ mb: 1 }}>
        {title}
      </Typography>
      <ErrorBoundary>{children}</ErrorBoundary>
    </Paper>
  );
}

function InstrumentsPanel() {
  const instruments = usePortalInstruments();
  if (instruments.isPending) return <Typography color="text.secondary">Loading…</Typography>;
  if (instruments.isError) return <Alert severity="error">Your instruments could not be loaded.</Alert>;
  if (instruments.data.items.length === 0) return <Typography color="text.secondary">No instruments are registered for your organisation yet.</Typography>;
  return (
    <Box sx={{ overflowX: 'auto' }}>
      <Table size="small" aria-label="Instruments">
        <TableHead>
          <TableRow>
            <TableCell>Instrument</TableCell>
            <TableCell sx={HIDE_ON_PHONE}>Serial</TableCell>
            <TableCell sx={HIDE_ON_PHONE}>Asset tag</TableCell>
            <TableCell sx={{ ...HIDE_ON_PHONE, textAlign: 'right' }}>Ranges</TableCell>
            <TableCell sx={{ ...HIDE_ON_PHONE, textAlign: 'right' }}>Interval</TableCell>
            <TableCell>Next calibration due</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {instruments.data.items.map((i) => (
            <TableRow key={i.id}>
              <TableCell>
                {i.make} {i.model}
                <PhoneSecondLine
                  parts={[
                    `s/n ${i.serial}`,
                    i.assetTag && `asset ${i.assetTag}`,
                    `${i.ranges.length} ${i.ranges.length === 1 ? 'range' : 'ranges'}`,
                    `every ${i.recallIntervalMonths} months`,
                  ]}
                />
              </TableCell>
              <TableCell sx={{ ...numberSx, ...HIDE_ON_PHONE }}>{i.serial}</TableCell>
              <TableCell sx={{ ...numberSx, ...HIDE_ON_PHONE }}>{i.assetTag ?? '—'}</TableCell>
              <TableCell sx={{ ...numberSx, ...HIDE_ON_PHONE, textAlign: 'right' }}>{i.ranges.length}</TableCell>
              <TableCell sx={{ ...numberSx, ...HIDE_ON_PHONE, textAlign: 'right' }}>{i.recallIntervalMonths} months</TableCell>
              <TableCell>
                <Due date={i.nextDueDate} />
              </TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </Box>
  );
}

/** The slot the route fills with the invoices feature's pay button (features never import each other). */
type PayInvoiceSlot = (invoiceId: number) => ReactNode;

function JobsPanel({ payInvoice }: { payInvoice?: PayInvoiceSlot }) {
  const jobs = usePortalJobs();
  if (jobs.isPending) return <Typography color="text.secondary">Loading…</Typography>;
  if (jobs.isError) return <Alert severity="error">Your jobs could not be loaded.</Alert>;
  if (jobs.data.items.length === 0) return <Typography color="text.secondary">No instrument of yours is with the lab at the moment.</Typography>;
  return (
    <Box sx={{ overflowX: 'auto' }}>
      <Table size="small" aria-label="Jobs">
        <TableHead>
          <TableRow>
            <TableCell>Job</TableCell>
            <TableCell sx={HIDE_ON_PHONE}>Instrument</TableCell>
            <TableCell sx={HIDE_ON_PHONE}>Received</TableCell>
            <TableCell>Where it stands</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {jobs.data.items.map((j) => {
            const words = JOB_STATUS_WORDS[j.status];
            return (
              <TableRow key={j.id}>
                <TableCell>
                  <Box component="span" sx={numberSx}>
                    {j.number}
                  </Box>
                  <PhoneSecondLine parts={[j.instrumentLabel, `received ${formatDate(j.receivedDate)}`]} />
                </TableCell>
                <TableCell sx={HIDE_ON_PHONE}>{j.instrumentLabel}</TableCell>
                <TableCell sx={{ ...numberSx, ...HIDE_ON_PHONE }}>{formatDate(j.receivedDate)}</TableCell>
                <TableCell>
                  <Chip size="small" color={words.color} variant="outlined" label={words.label} sx={{ height: 20 }} />
                  {j.release && !j.release.released && (
                    <Box sx={{ mt: 0.5, display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap' }}>
                      <Typography variant="caption" color="text.secondary">
                        {j.release.heldReason ?? 'The certificate is held until the invoice is paid.'}
                      </Typography>
                      {j.release.invoiceId !== null && payInvoice?.(j.release.invoiceId)}
                    </Box>
                  )}
                </TableCell>
              </TableRow>
            );
          })}
        </TableBody>
      </Table>
    </Box>
  );
}

type PortalOverviewProps = {
  certificates: ReactNode;
  /** The button that pays the invoice holding a job's certificate back, composed by the route. */
  payInvoice?: PayInvoiceSlot;
};

/** A customer's overview: their instruments and when each is due, their jobs, and their certificates. */
export function PortalOverview({ certificates, payInvoice }: PortalOverviewProps) {
  const user = useCurrentUser();
  const instruments = usePortalInstruments();
  const organisation = instruments.data?.items[0]?.organizationName;
  return (
    <Box sx={{ maxWidth: 1200 }}>
      <Typography variant="h1" sx={{ mb: 0.5 }}>
        {organisation ?? 'Your organisation'}
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 2 }}>
        Signed in as {user.name}. Your instruments, where each job stands, and your calibration certificates.
      </Typography>
      <Section title="Certificates" label="Certificates">
        {certificates}
      </Section>
      <Section title="Instruments" label="Instruments">
        <InstrumentsPanel />
      </Section>
      <Section title="Jobs" label="Jobs">
        <JobsPanel payInvoice={payInvoice} />
      </Section>
    </Box>
  );
}
