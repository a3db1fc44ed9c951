import Link from '@mui/material/Link';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router-dom';
import type { Job } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { jobPath } from '@/config/paths';
import { formatDate } from '@/utils/format';
import { JobStatusChip } from './job-status-chip';

/** A compact list of jobs (an instrument's visits), newest first. */
export function JobsList({ jobs, emptyText = 'No jobs yet.' }: { jobs: readonly Job[]; emptyText?: string }) {
  if (jobs.length === 0) {
    return (
      <Typography variant="body2" color="text.secondary">
        {emptyText}
      </Typography>
    );
  }
  return (
    <Table size="small" aria-label="Jobs">
      <TableHead>
        <TableRow>
          <TableCell>Job</TableCell>
          <TableCell>Received</TableCell>
          <TableCell>Status</TableCell>
          <TableCell>Technician</TableCell>
          <TableCell align="right">Runs</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        {jobs.map((job) => (
          <TableRow key={job.id} hover>
            <TableCell>
              <Link component={RouterLink} to={jobPath(job.id)} underline="hover">
                <Num>{job.number}</Num>
              </Link>
            </TableCell>
            <TableCell>
              <Num>{formatDate(job.receivedDate)}</Num>
            </TableCell>
            <TableCell>
              <JobStatusChip status={job.status} />
            </TableCell>
            <TableCell>{job.technicianName ?? '—'}</TableCell>
            <TableCell align="right">
              <Num>{job.runCount}</Num>
            </TableCell>
          </TableRow>
        ))}
      </TableBody>
    </Table>
  );
}
