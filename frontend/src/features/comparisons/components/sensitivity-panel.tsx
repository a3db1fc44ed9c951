import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { InstrumentSensitivity } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { formatDate } from '@/utils/format';
import { formatNumber, formatSignificant } from '@/utils/frequency';

const num = { ...numberSx, fontSize: '0.8125rem', textAlign: 'right' } as const;

/** The same instrument's supply-sensitivity and keying runs, for the other side of the story. */
export function SensitivityPanel({ sensitivity }: { sensitivity: InstrumentSensitivity }) {
  const { supplySensitivity, keying } = sensitivity;
  return (
    <Paper variant="outlined" component="section" aria-label="Supply sensitivity and keying" sx={{ p: 2 }}>
      <Typography variant="h3" component="h3" sx={{ mb: 1 }}>
        Supply sensitivity and keying
      </Typography>
      <Typography variant="h4" component="h4" sx={{ mt: 1 }}>
        Supply sensitivity
      </Typography>
      {supplySensitivity.length === 0 ? (
        <Typography variant="body2" color="text.secondary">
          No supply-sensitivity run of this instrument.
        </Typography>
      ) : (
        <Box sx={{ overflowX: 'auto' }}>
          <Table size="small" aria-label="Supply sensitivity" sx={{ '& td, & th': { py: 0.5, px: 1 } }}>
            <TableHead>
              <TableRow>
                <TableCell>Run</TableCell>
                <TableCell>Started</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>Hz per volt</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>n</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {supplySensitivity.map((entry) => (
                <TableRow key={entry.runId}>
                  <TableCell>
                    {entry.runId} · {entry.jobNumber}
                    <Typography variant="caption" component="div" color="text.secondary">
                      {entry.configuration ?? entry.rangeLabel}
                    </Typography>
                  </TableCell>
                  <TableCell sx={numberSx}>{formatDate(entry.startedAt)}</TableCell>
                  <TableCell sx={num}>
                    {entry.hzPerVolt === null
                      ? (entry.problem ?? '—')
                      : `${formatSignificant(entry.hzPerVolt, 3)} ± ${formatSignificant(entry.seHzPerVolt ?? 0, 2)} Hz/V`}
                  </TableCell>
                  <TableCell sx={num}>{entry.n}</TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </Box>
      )}
      <Typography variant="h4" component="h4" sx={{ mt: 2 }}>
        Keying shift (key down − key up)
      </Typography>
      {keying.length === 0 ? (
        <Typography variant="body2" color="text.secondary">
          No keying run of this instrument.
        </Typography>
      ) : (
        <Box sx={{ overflowX: 'auto' }}>
          <Table size="small" aria-label="Keying shift" sx={{ '& td, & th': { py: 0.5, px: 1 } }}>
            <TableHead>
              <TableRow>
                <TableCell>Run</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>Shift</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>95 % interval</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>Transient</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {keying.map((entry) => (
                <TableRow key={entry.runId}>
                  <TableCell>
                    {entry.runId} · {entry.jobNumber}
                    <Typography variant="caption" component="div" color="text.secondary">
                      {entry.configuration ?? entry.rangeLabel}
                    </Typography>
                  </TableCell>
                  {entry.shift ? (
                    <>
                      <TableCell sx={num}>
                        {formatNumber(entry.shift.shiftHz, 1)} ± {formatNumber(entry.shift.seHz, 1)} Hz
                      </TableCell>
                      <TableCell sx={num}>
                        {formatNumber(entry.shift.low, 1)} to {formatNumber(entry.shift.high, 1)} Hz
                      </TableCell>
                      <TableCell sx={num}>{formatNumber(entry.shift.keyDownPeakDeviationHz, 1)} Hz</TableCell>
                    </>
                  ) : (
                    <TableCell colSpan={3} sx={{ color: 'text.secondary' }}>
                      {entry.problem ?? '—'}
                    </TableCell>
                  )}
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </Box>
      )}
    </Paper>
  );
}
