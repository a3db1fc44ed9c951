import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { CALIBRATION_RUN_KINDS, type ReviewRun } from '@kilocycle/common/types';
import { HiddenLabel } from '@/components/ui/hidden-label';
import { numberSx } from '@/components/ui/num';
import { formatDate, formatDateTime } from '@/utils/format';
import { formatCount } from '@/utils/measurement';
import { RUN_KIND_LABELS } from '../utils/results-format';
import { RunBudgetDialog } from './run-budget-dialog';

type ReviewRunsProps = { runs: readonly ReviewRun[]; canEditBudgets: boolean; rangeUnits: Record<number, string>; runPath?: (runId: number) => string };

/** Every run of the job, with the standard it used (and any override of a lapsed one) and who captured it. */
export function ReviewRuns({ runs, canEditBudgets, rangeUnits, runPath }: ReviewRunsProps) {
  const [budgetRun, setBudgetRun] = useState<ReviewRun | null>(null);
  return (
    <Paper variant="outlined" component="section" aria-label="Runs" sx={{ p: 2, mb: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Runs and standards
      </Typography>
      <Box sx={{ overflowX: 'auto' }}>
        <Table size="small" aria-label="Runs of this job" sx={{ '& td, & th': { py: 0.5, px: 1 } }}>
          <TableHead>
            <TableRow>
              <TableCell>Run</TableCell>
              <TableCell>Kind</TableCell>
              <TableCell>Range</TableCell>
              <TableCell>Standard</TableCell>
              <TableCell>Captured by</TableCell>
              <TableCell>Started</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Readings</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Excluded</TableCell>
              <TableCell>
                <HiddenLabel>Actions</HiddenLabel>
              </TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {runs.map((run) => {
              const calibration = CALIBRATION_RUN_KINDS.includes(run.kind);
              return (
                <TableRow key={run.id}>
                  <TableCell sx={numberSx}>
                    {runPath ? (
                      <Link component={RouterLink} to={runPath(run.id)} aria-label={`Readings of run ${run.id}`}>
                        {run.id}
                      </Link>
                    ) : (
                      run.id
                    )}
                  </TableCell>
                  <TableCell>
                    {RUN_KIND_LABELS[run.kind]}{' '}
                    {calibration && !run.used && (
                      <Tooltip title="Another run of this range and kind is the one the results use">
                        <Chip size="small" variant="outlined" label="not used" sx={{ height: 18, fontSize: '0.7rem' }} />
                      </Tooltip>
                    )}
                  </TableCell>
                  <TableCell>{run.rangeLabel}</TableCell>
                  <TableCell>
                    {run.standardName ?? '—'}
                    {run.standardDueDate && (
                      <Typography component="span" variant="caption" color="text.secondary" sx={{ ml: 0.5 }}>
                        due {formatDate(run.standardDueDate)}
                      </Typography>
                    )}
                    {run.standardOverrideReason && (
                      <Typography variant="caption" component="div" sx={{ color: 'warning.dark' }}>
                        Used past its due date: {run.standardOverrideReason}
                      </Typography>
                    )}
                  </TableCell>
                  <TableCell>{run.createdByName}</TableCell>
                  <TableCell sx={numberSx}>{formatDateTime(run.startedAt)}</TableCell>
                  <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{formatCount(run.readingCount)}</TableCell>
                  <TableCell sx={{ ...numberSx, textAlign: 'right', color: run.excludedCount > 0 ? 'warning.dark' : undefined }}>
                    {formatCount(run.excludedCount)}
                  </TableCell>
                  <TableCell sx={{ textAlign: 'right' }}>
                    {calibration && (
                      <Button size="small" onClick={() => setBudgetRun(run)} aria-label={`${canEditBudgets ? 'Edit budget' : 'Budget'} of run ${run.id}`}>
                        {canEditBudgets ? 'Edit budget' : 'Budget'}
                      </Button>
                    )}
                  </TableCell>
                </TableRow>
              );
            })}
          </TableBody>
        </Table>
      </Box>
      {budgetRun && (
        <RunBudgetDialog
          runId={budgetRun.id}
          title={`Budget of run ${budgetRun.id}: ${RUN_KIND_LABELS[budgetRun.kind].toLowerCase()}, range ${budgetRun.rangeLabel}`}
          dialUnit={rangeUnits[budgetRun.rangeId] ?? 'dial unit'}
          canEdit={canEditBudgets}
          onClose={() => setBudgetRun(null)}
        />
      )}
    </Paper>
  );
}
