import Link from '@mui/material/Link';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router-dom';
import type { Run } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { jobPath, runPath } from '@/config/paths';
import { formatDateTime } from '@/utils/format';
import { formatCount } from '@/utils/measurement';
import { RunKindChip, RunStatusChip } from './run-labels';

type RunsTableProps = { runs: readonly Run[]; showJob?: boolean; emptyText?: string; label?: string };

/** A compact list of runs, each linking to its page (bench page or study). */
export function RunsTable({ runs, showJob = false, emptyText = 'No runs yet.', label = 'Runs' }: RunsTableProps) {
  if (runs.length === 0) {
    return (
      <Typography variant="body2" color="text.secondary">
        {emptyText}
      </Typography>
    );
  }
  return (
    <Table size="small" aria-label={label}>
      <TableHead>
        <TableRow>
          <TableCell>Run</TableCell>
          {showJob && <TableCell>Job</TableCell>}
          <TableCell>Kind</TableCell>
          <TableCell>Range</TableCell>
          <TableCell>Standard</TableCell>
          <TableCell>Started</TableCell>
          <TableCell align="right">Readings</TableCell>
          <TableCell>Status</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {runs.map((run) => (
          <TableRow key={run.id} hover>
            <TableCell>
              <Link component={RouterLink} to={runPath(run.id)} underline="hover" aria-label={`Run ${run.id}`}>
                <Num>#{run.id}</Num>
              </Link>
            </TableCell>
            {showJob && (
              <TableCell>
                <Link component={RouterLink} to={jobPath(run.jobId)} underline="hover">
                  <Num>{run.jobNumber}</Num>
                </Link>
              </TableCell>
            )}
            <TableCell>
              <RunKindChip kind={run.kind} />
            </TableCell>
            <TableCell sx={{ whiteSpace: 'pre' }}>{run.rangeLabel}</TableCell>
            <TableCell>
              {run.standardName ?? '—'}
              {run.benchName && (
                <Typography variant="caption" color="text.secondary" component="div">
                  on {run.benchName}
                </Typography>
              )}
              {run.standardOverrideReason && (
                <Typography variant="caption" color="warning.main" component="div">
                  Lapsed standard used: {run.standardOverrideReason}
                </Typography>
              )}
            </TableCell>
            <TableCell>
              <Num>{formatDateTime(run.startedAt)}</Num>
            </TableCell>
            <TableCell align="right">
              <Num>
                {formatCount(run.readingCount)}
                {run.excludedCount > 0 ? ` (${formatCount(run.excludedCount)} excl.)` : ''}
              </Num>
            </TableCell>
            <TableCell>
              <RunStatusChip status={run.status} />
            </TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}
