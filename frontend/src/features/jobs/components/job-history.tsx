import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { AuditEventView } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { formatDateTime } from '@/utils/format';
import { useJobHistory } from '../api/get-job-history';

const ACTIONS: Record<string, string> = {
  create: 'created',
  update: 'changed',
  status: 'status changed',
  exclude: 'reading excluded',
  standard_override: 'lapsed standard used by override',
  submit: 'submitted for review',
  readings: 'readings stored',
  import: 'readings imported',
  budget: 'budget edited',
};

function describe(event: AuditEventView): string {
  const c = event.changes ?? {};
  const str = (v: unknown) => (v === null || v === undefined ? '—' : String(v));
  if (event.action === 'status' && 'from' in c && 'to' in c) {
    return `${str(c.from)} → ${str(c.to)}${c.comment ? ` (${str(c.comment)})` : ''}`;
  }
  if (event.action === 'exclude') return `seq ${str(c.seq)} of run ${str(c.runId)}: ${str(c.reason)}`;
  if (event.action === 'standard_override') return `${str(c.standardName)}, due ${str(c.dueDate)}: ${str(c.reason)}`;
  if (event.entity === 'run' && event.action === 'create') return `${str(c.kind).replace('_', '-')} on ${str(c.rangeLabel)}`;
  if (event.action === 'update') return Object.keys(c).join(', ');
  if (event.entity === 'run' && (event.action === 'readings' || event.action === 'import')) {
    const author = (c.author ?? null) as { kind?: string; name?: string } | null;
    const by = author?.name ? ` by ${author.kind === 'bench' ? 'bench ' : ''}${author.name}` : '';
    if (event.action === 'import') return `${str(c.imported)} from ${str(c.file)}${by}`;
    const seqs = c.firstSeq !== null && c.firstSeq !== undefined ? `, seq ${str(c.firstSeq)}–${str(c.lastSeq)}` : '';
    return `${str(c.accepted)} (${str(c.source)})${by}${seqs}`;
  }
  if (event.action === 'budget')
    return Object.keys(c)
      .filter((k) => k !== 'jobId' && k !== 'jobNumber')
      .join(', ');
  return '';
}

/** Everything that happened to the job, its runs and their readings, newest first. */
export function JobHistory({ jobId }: { jobId: number }) {
  const history = useJobHistory({ jobId });
  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        History
      </Typography>
      {history.isPending ? (
        <Typography variant="body2" color="text.secondary">
          Loading…
        </Typography>
      ) : history.isError ? (
        <Typography variant="body2" color="error">
          The history could not be loaded.
        </Typography>
      ) : history.data.items.length === 0 ? (
        <Typography variant="body2" color="text.secondary">
          Nothing recorded yet.
        </Typography>
      ) : (
        <Table size="small" aria-label="Job history">
          <TableHead>
            <TableRow>
              <TableCell>When</TableCell>
              <TableCell>Who</TableCell>
              <TableCell>What</TableCell>
              <TableCell>Details</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {history.data.items.map((event) => (
              <TableRow key={event.id}>
                <TableCell sx={{ whiteSpace: 'nowrap' }}>
                  <Num>{formatDateTime(event.at)}</Num>
                </TableCell>
                <TableCell>{event.actorName ?? 'the system'}</TableCell>
                <TableCell>
                  {event.entity} {event.entity === 'job' ? '' : <Num>{event.entityId}</Num>} {ACTIONS[event.action] ?? event.action}
                </TableCell>
                <TableCell sx={{ color: 'text.secondary' }}>{describe(event)}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      )}
    </Paper>
  );
}
