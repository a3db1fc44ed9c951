import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ExcludedReading } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { formatDateTime } from '@/utils/format';
import { formatHzTo, formatNumber } from '@/utils/frequency';

/** Readings left out of the results, each with the reason given and who gave it. Nothing is ever deleted. */
export function ExcludedReadings({ readings }: { readings: readonly ExcludedReading[] }) {
  return (
    <Paper variant="outlined" component="section" aria-label="Excluded readings" sx={{ p: 2, mb: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Excluded readings
      </Typography>
      {readings.length === 0 ? (
        <Typography color="text.secondary">No reading of this job has been excluded.</Typography>
      ) : (
        <Box sx={{ overflowX: 'auto' }}>
          <Table size="small" aria-label="Excluded readings" sx={{ '& td, & th': { py: 0.5, px: 1 } }}>
            <TableHead>
              <TableRow>
                <TableCell>Run</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>No.</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>Dial</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>Frequency</TableCell>
                <TableCell>Reason</TableCell>
                <TableCell>Excluded by</TableCell>
                <TableCell>When</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {readings.map((r) => (
                <TableRow key={r.readingId}>
                  <TableCell sx={numberSx}>{r.runId}</TableCell>
                  <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{r.seq}</TableCell>
                  <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{r.dial === null ? '—' : formatNumber(r.dial, 3)}</TableCell>
                  <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{formatHzTo(r.frequency, 0.1)}</TableCell>
                  <TableCell>{r.reason}</TableCell>
                  <TableCell>{r.excludedByName ?? '—'}</TableCell>
                  <TableCell sx={numberSx}>{formatDateTime(r.excludedAt)}</TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </Box>
      )}
    </Paper>
  );
}
