import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import Typography from '@mui/material/Typography';
import { useState, type ReactNode } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { OPEN_JOB_STATUSES, PHASE_RUN_KINDS } from '@kilocycle/common/rules';
import type { Run } from '@kilocycle/common/types';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { Num } from '@/components/ui/num';
import { instrumentPath, jobPath } from '@/config/paths';
import { useCurrentUser } from '@/lib/auth';
import { formatDateTime } from '@/utils/format';
import { useUpdateRun } from '../api/update-run';
import { CorrectRunDialog } from './correct-run-dialog';
import { RunNotes } from './run-notes';
import { RUN_KIND_LABELS, RunDataKindChip, RunKindChip, RunStatusChip } from './run-labels';

type RunHeaderProps = { run: Run; canWrite: boolean; extra?: ReactNode };

/**
 * Title, where the run belongs, "Close run" and "Correct run details" for whoever may write to it
 * (corrections only while the job is open), and, for lab staff, the run's Notes: its notes, imports and corrections.
 */
export function RunHeader({ run, canWrite, extra }: RunHeaderProps) {
  const user = useCurrentUser();
  const [closing, setClosing] = useState(false);
  const mayCorrect = canWrite && OPEN_JOB_STATUSES.includes(run.jobStatus);
  const update = useUpdateRun({ onSuccess: () => setClosing(false) });
  return (
    <Box sx={{ mb: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5, flexWrap: 'wrap' }}>
        <Typography variant="h1" component="h1">
          {RUN_KIND_LABELS[run.kind]} run <Num>#{run.id}</Num>
        </Typography>
        <RunKindChip kind={run.kind} />
        {PHASE_RUN_KINDS.includes(run.kind) && <RunDataKindChip dataKind={run.dataKind ?? 'frequency'} />}
        <RunStatusChip status={run.status} />
        <Box sx={{ flex: 1 }} />
        {extra}
        {mayCorrect && <CorrectRunDialog run={run} role={user.role} />}
        {canWrite && run.status === 'open' && (
          <Button variant="outlined" onClick={() => setClosing(true)}>
            Close run
          </Button>
        )}
      </Box>
      <Typography variant="body2" color="text.secondary" sx={{ mt: 0.5 }}>
        Job{' '}
        <Link component={RouterLink} to={jobPath(run.jobId)}>
          <Num>{run.jobNumber}</Num>
        </Link>{' '}
        ·{' '}
        <Link component={RouterLink} to={instrumentPath(run.instrumentId)}>
          {run.instrumentLabel}
        </Link>{' '}
        · range{' '}
        <Box component="span" sx={{ whiteSpace: 'pre' }}>
          {run.rangeLabel}
        </Box>{' '}
        · {run.benchName ?? 'no bench'} · {run.standardName ?? 'no standard'} · started <Num>{formatDateTime(run.startedAt)}</Num>
        {run.endedAt && (
          <>
            {' '}
            · closed <Num>{formatDateTime(run.endedAt)}</Num>
          </>
        )}
      </Typography>
      {(run.configuration || run.supplyVoltage !== null) && (
        <Typography variant="body2" color="text.secondary">
          {run.supplyVoltage !== null && (
            <>
              Supply <Num>{run.supplyVoltage} V</Num>
              {run.configuration ? ' · ' : ''}
            </>
          )}
          {run.configuration}
        </Typography>
      )}
      {run.standardOverrideReason && (
        <Typography variant="body2" color="warning.main">
          Lapsed standard used by a lead’s override: {run.standardOverrideReason}
        </Typography>
      )}
      {run.standardId === null && (run.kind === 'as_found' || run.kind === 'as_left') && (
        <Typography variant="body2" color="warning.main">
          No reference standard: set it with “Correct run details” before the job is submitted for review.
        </Typography>
      )}
      {user.role !== 'client' && <RunNotes run={run} />}
      <ConfirmDialog
        open={closing}
        title="Close this run?"
        confirmLabel="Close run"
        busy={update.isPending}
        onClose={() => setClosing(false)}
        onConfirm={() => update.mutate({ id: run.id, changes: { status: 'closed' } })}
      >
        A closed run takes no more readings and cannot be opened again. Its readings and exclusions stay as they are.
      </ConfirmDialog>
    </Box>
  );
}
