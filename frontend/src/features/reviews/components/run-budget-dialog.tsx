import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControlLabel from '@mui/material/FormControlLabel';
import Switch from '@mui/material/Switch';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useEffect, useId, useState, type FormEvent } from 'react';
import type { RunBudget, UpdateRunBudgetRequest } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { formatDateTime } from '@/utils/format';
import { useRunBudget } from '../api/get-run-budget';
import { useUpdateRunBudget } from '../api/update-run-budget';
import { ExtraComponentsEditor, fromDrafts, toDrafts, type ExtraComponentDraft } from './extra-components-editor';

type NumberField = 'dialHalfDivision' | 'driftPpm' | 'driftHz' | 'counterResolutionHz';

type Draft = Record<NumberField, string> & { note: string; overrideExtras: boolean; extras: ExtraComponentDraft[] };

function toDraft(budget: RunBudget): Draft {
  const text = (value: number | null) => (value === null ? '' : String(value));
  return {
    dialHalfDivision: text(budget.dialHalfDivision),
    driftPpm: text(budget.driftPpm),
    driftHz: text(budget.driftHz),
    counterResolutionHz: text(budget.counterResolutionHz),
    note: budget.note ?? '',
    overrideExtras: budget.extraComponents !== null,
    extras: toDrafts(budget.extraComponents ?? budget.effective.extraComponents),
  };
}

type RunBudgetDialogProps = { runId: number; title: string; dialUnit: string; canEdit: boolean; onClose: () => void };

/** A run's budget figures: each left empty follows the procedure (or the standard); a figure typed here replaces it. */
export function RunBudgetDialog({ runId, title, dialUnit, canEdit, onClose }: RunBudgetDialogProps) {
  const titleId = useId();
  const budget = useRunBudget(runId);
  const [draft, setDraft] = useState<Draft | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const update = useUpdateRunBudget({
    onSuccess: () => {
      notify('success', `Budget of run ${runId} saved; the results are computed again.`);
      onClose();
    },
  });

  useEffect(() => {
    if (budget.data && draft === null) setDraft(toDraft(budget.data));
  }, [budget.data, draft]);

  const editable = canEdit && Boolean(budget.data?.editable);
  const effective = budget.data?.effective;

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (!draft) return;
    const changes: UpdateRunBudgetRequest = { note: draft.note.trim() || null };
    for (const field of ['dialHalfDivision', 'driftPpm', 'driftHz', 'counterResolutionHz'] as const) {
      const raw = draft[field].trim();
      if (raw === '') {
        changes[field] = null;
        continue;
      }
      const value = Number(raw);
      if (!Number.isFinite(value) || value < 0) {
        setProblem('Each figure must be a number of zero or more, or empty to follow the procedure');
        return;
      }
      changes[field] = value;
    }
    if (draft.overrideExtras) {
      const parsed = fromDrafts(draft.extras);
      if ('problem' in parsed) {
        setProblem(parsed.problem);
        return;
      }
      changes.extraComponents = parsed.components;
    } else {
      changes.extraComponents = null;
    }
    setProblem(null);
    update.mutate({ runId, changes });
  };

  const field = (name: NumberField, label: string, unit: string, follows: number | null | undefined) => (
    <TextField
      label={`${label} (${unit})`}
      inputMode="decimal"
      value={draft?.[name] ?? ''}
      onChange={(e) => draft && setDraft({ ...draft, [name]: e.target.value })}
      placeholder={follows === null || follows === undefined ? 'standard’s figure' : String(follows)}
      helperText={follows === null || follows === undefined ? 'Empty: the standard’s figure' : `Empty: ${follows} ${unit} from the procedure`}
      disabled={!editable}
      slotProps={{ inputLabel: { shrink: true } }}
    />
  );

  const messages = update.error ? (update.error instanceof ApiError ? update.error.messages : ['The budget could not be saved.']) : [];

  return (
    <Dialog open onClose={update.isPending ? undefined : onClose} aria-labelledby={titleId} maxWidth="md">
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>{title}</DialogTitle>
        <DialogContent>
          {budget.isPending && <CircularProgress size={24} />}
          {budget.isError && <Alert severity="error">The budget could not be loaded.</Alert>}
          {budget.data && draft && effective && (
            <>
              <FormErrors messages={problem ? [problem, ...messages] : messages} />
              {!budget.data.editable && (
                <Alert severity="info" sx={{ mb: 2 }}>
                  The job is signed: this budget is part of the issued certificate and cannot change.
                </Alert>
              )}
              <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
                Procedure: {effective.procedureName}.
                {budget.data.updatedAt && ` Last changed by ${budget.data.updatedByName ?? '—'} at ${formatDateTime(budget.data.updatedAt)}.`}
              </Typography>
              <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr' }, gap: 2, mb: 2 }}>
                {field('dialHalfDivision', 'Half a dial division', dialUnit, effective.dialHalfDivision)}
                {field('counterResolutionHz', 'Counter resolution, ±1 count', 'Hz', effective.counterResolutionHz)}
                {field('driftPpm', 'Drift allowance', 'ppm', effective.driftPpm)}
                {field('driftHz', 'Drift allowance', 'Hz', effective.driftHz)}
              </Box>
              <FormControlLabel
                control={
                  <Switch
                    checked={draft.overrideExtras}
                    onChange={(e) => setDraft({ ...draft, overrideExtras: e.target.checked })}
                    disabled={!editable}
                  />
                }
                label="This run has its own extra components"
              />
              <Box sx={{ mt: 1, mb: 2 }}>
                <ExtraComponentsEditor
                  value={draft.overrideExtras ? draft.extras : toDrafts(effective.extraComponents)}
                  onChange={(extras) => setDraft({ ...draft, extras })}
                  disabled={!editable || !draft.overrideExtras}
                />
              </Box>
              <TextField
                label="Note"
                multiline
                minRows={2}
                value={draft.note}
                onChange={(e) => setDraft({ ...draft, note: e.target.value })}
                helperText="Why the figures differ from the procedure’s"
                disabled={!editable}
              />
            </>
          )}
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose} disabled={update.isPending}>
            {editable ? 'Cancel' : 'Close'}
          </Button>
          {editable && (
            <Button type="submit" variant="contained" disabled={update.isPending || !draft}>
              {update.isPending ? 'Saving…' : 'Save budget'}
            </Button>
          )}
        </DialogActions>
      </form>
    </Dialog>
  );
}
