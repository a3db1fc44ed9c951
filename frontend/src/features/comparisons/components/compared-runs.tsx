import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ComparisonResult } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { formatDateTime } from '@/utils/format';
import { formatDuration, formatHzTo } from '@/utils/frequency';
import { formatCount } from '@/utils/measurement';
import { runColor } from '../utils/comparison-format';

/** Which runs are compared: where they come from, how they were set up, and how much of each was used. */
export function ComparedRuns({ result }: { result: ComparisonResult }) {
  return (
    <Paper variant="outlined" component="section" aria-label="Compared runs" sx={{ p: 2 }}>
      <Typography variant="h3" component="h3" sx={{ mb: 1 }}>
        Runs
      </Typography>
      <Box sx={{ overflowX: 'auto' }}>
        <Table size="small" aria-label="Compared runs" sx={{ '& td, & th': { py: 0.5, px: 1, verticalAlign: 'top' } }}>
          <TableHead>
            <TableRow>
              <TableCell>Label</TableCell>
              <TableCell>Run</TableCell>
              <TableCell>Started</TableCell>
              <TableCell>Set-up</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Readings used</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>f∞</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Settled after</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {result.runs.map((run, i) => (
              <TableRow key={run.runId}>
                <TableCell>
                  <Box sx={{ display: 'flex', gap: 1, alignItems: 'center' }}>
                    <Box sx={{ width: 12, height: 12, borderRadius: '2px', bgcolor: runColor(i), flexShrink: 0 }} aria-hidden />
                    <span>{run.label}</span>
                  </Box>
                </TableCell>
                <TableCell sx={numberSx}>
                  {run.runId} · {run.jobNumber}
                  <Typography variant="caption" component="div" color="text.secondary">
                    {run.rangeLabel}
                  </Typography>
                </TableCell>
                <TableCell sx={numberSx}>{formatDateTime(run.startedAt)}</TableCell>
                <TableCell>
                  <Typography variant="body2">{run.configuration ?? '—'}</Typography>
                  {run.supplyVoltage !== null && (
                    <Typography variant="caption" color="text.secondary">
                      Supply {run.supplyVoltage} V
                    </Typography>
                  )}
                  {run.fitProblem && (
                    <Typography variant="caption" component="div" sx={{ color: 'warning.dark' }}>
                      No warm-up fit: {run.fitProblem}
                    </Typography>
                  )}
                </TableCell>
                <TableCell sx={{ ...numberSx, textAlign: 'right' }}>
                  {formatCount(run.usedCount)} of {formatCount(run.readingCount)}
                </TableCell>
                <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{run.fit ? formatHzTo(run.fit.fInf, 0.1) : '—'}</TableCell>
                <TableCell sx={{ ...numberSx, textAlign: 'right' }}>
                  {run.settledFromSeconds === null ? 'not within the record' : formatDuration(run.settledFromSeconds)}
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>
    </Paper>
  );
}
