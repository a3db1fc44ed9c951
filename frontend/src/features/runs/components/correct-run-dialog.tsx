import EditNoteOutlined from '@mui/icons-material/EditNoteOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import InputAdornment from '@mui/material/InputAdornment';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import { useQueryClient } from '@tanstack/react-query';
import { useId, useState, type FormEvent } from 'react';
import { CALIBRATION_RUN_KINDS, type Role, type Run, type UpdateRunRequest } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import { useStandards } from '@/features/standards/api/get-standards';
import { ApiError } from '@/lib/api-client';
import { formatDate } from '@/utils/format';
import { getRunCorrectionsQueryOptions } from '../api/get-run-corrections';
import { useUpdateRun } from '../api/update-run';

const MIN_REASON = 3;
const MIN_OVERRIDE_REASON = 10;

type Draft = { standardId: string; supplyVoltage: string; configuration: string; notes: string; reason: string; overrideReason: string };

const draftOf = (run: Run): Draft => ({
  standardId: run.standardId === null ? '' : String(run.standardId),
  supplyVoltage: run.supplyVoltage === null ? '' : String(run.supplyVoltage),
  configuration: run.configuration ?? '',
  notes: run.notes ?? '',
  reason: '',
  overrideReason: '',
});

/**
 * "Correct run details": the standard, supply voltage, configuration and notes of a run whose job is
 * still open, each correction with a reason that goes into the audit trail with the old and new values.
 */
export function CorrectRunDialog({ run, role }: { run: Run; role: Role }) {
  const titleId = useId();
  const queryClient = useQueryClient();
  const [open, setOpen] = useState(false);
  const [draft, setDraft] = useState<Draft>(() => draftOf(run));
  const [problem, setProblem] = useState<string | null>(null);
  const standards = useStandards({ query: { active: true, pageSize: 200, sort: 'name' }, enabled: open });
  const update = useUpdateRun({
    onSuccess: () => {
      setOpen(false);
      void queryClient.invalidateQueries({ queryKey: getRunCorrectionsQueryOptions(run.id).queryKey });
    },
  });
  const needsStandard = CALIBRATION_RUN_KINDS.includes(run.kind);
  const choices = standards.data?.items ?? [];
  const chosen = choices.find((s) => String(s.id) === draft.standardId);
  const standardChanged = draft.standardId !== (run.standardId === null ? '' : String(run.standardId));
  const lapsed = standardChanged && Boolean(chosen?.overdue);
  const askOverride = lapsed && role === 'lead';

  const set = (field: keyof Draft, value: string) => {
    setDraft((d) => ({ ...d, [field]: value }));
    setProblem(null);
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const changes: UpdateRunRequest = {};
    if (standardChanged) changes.standardId = draft.standardId ? Number(draft.standardId) : null;
    const volts = draft.supplyVoltage.trim() === '' ? null : Number(draft.supplyVoltage.replace(',', '.'));
    if (volts !== null && !(volts >= 0)) return setProblem('The supply voltage is a number of volts');
    if (volts !== run.supplyVoltage) changes.supplyVoltage = volts;
    const configuration = draft.configuration.trim() || null;
    if (configuration !== run.configuration) changes.configuration = configuration;
    const notes = draft.notes.trim() || null;
    if (notes !== run.notes) changes.notes = notes;
    if (Object.keys(changes).length === 0) return setProblem('Nothing is changed yet');
    if (needsStandard && changes.standardId === null) return setProblem('An as-found or as-left run needs a reference standard');
    const reason = draft.reason.trim();
    if (reason.length < MIN_REASON) return setProblem('Say why the details are corrected');
    const override = draft.overrideReason.trim();
    if (askOverride && override.length < MIN_OVERRIDE_REASON) return setProblem(`Write why the lapsed standard is used (at least ${MIN_OVERRIDE_REASON} characters)`);
    update.mutate({ id: run.id, changes: { ...changes, reason, ...(askOverride ? { standardOverrideReason: override } : {}) } });
  };

  const error = update.error;
  return (
    <>
      <Button
        variant="outlined"
        startIcon={<EditNoteOutlined />}
        onClick={() => {
          update.reset();
          setDraft(draftOf(run));
          setProblem(null);
          setOpen(true);
        }}
      >
        Correct run details
      </Button>
      <Dialog open={open} onClose={update.isPending ? undefined : () => setOpen(false)} aria-labelledby={titleId} fullWidth maxWidth="sm">
        <form noValidate onSubmit={submit}>
          <DialogTitle id={titleId}>Correct run details</DialogTitle>
          <DialogContent>
            <DialogContentText variant="body2" sx={{ mb: 2 }}>
              For details recorded wrongly when the run was opened. The readings stay as they are; the correction, its reason and the
              values before and after are kept in the audit trail with your name.
            </DialogContentText>
            <FormErrors messages={error instanceof ApiError ? error.messages : error ? ['The correction could not be saved.'] : []} />
            {problem && (
              <Alert severity="error" role="alert" sx={{ mb: 2 }}>
                {problem}
              </Alert>
            )}
            <Stack spacing={2} sx={{ pt: 1 }}>
              <TextField
                select
                label="Reference standard"
                required={needsStandard}
                value={choices.length === 0 && draft.standardId ? '' : draft.standardId}
                onChange={(e) => set('standardId', e.target.value)}
                helperText={needsStandard ? 'As-found and as-left results are stated against it' : 'The counter or reference measured against'}
              >
                {!needsStandard && <MenuItem value="">None</MenuItem>}
                {choices.map((s) => (
                  <MenuItem key={s.id} value={String(s.id)}>
                    {s.name} (due {formatDate(s.dueDate)}){s.overdue ? ' — calibration overdue' : ''}
                  </MenuItem>
                ))}
              </TextField>
              {lapsed && role !== 'lead' && <Alert severity="warning">This standard is past its due date: only a lead can use it, with a written reason.</Alert>}
              {askOverride && (
                <TextField
                  label="Why the lapsed standard is used"
                  required
                  multiline
                  minRows={2}
                  value={draft.overrideReason}
                  onChange={(e) => set('overrideReason', e.target.value)}
                />
              )}
              <TextField
                label="Supply voltage"
                value={draft.supplyVoltage}
                onChange={(e) => set('supplyVoltage', e.target.value)}
                slotProps={{ input: { endAdornment: <InputAdornment position="end">V</InputAdornment> }, htmlInput: { inputMode: 'decimal' } }}
              />
              <TextField label="Configuration" value={draft.configuration} onChange={(e) => set('configuration', e.target.value)} />
              <TextField label="Notes" multiline minRows={2} value={draft.notes} onChange={(e) => set('notes', e.target.value)} />
              <TextField
                label="Reason for the correction"
                required
                value={draft.reason}
                onChange={(e) => set('reason', e.target.value)}
                helperText="Kept in the audit trail, e.g. “Counter A was used; the run was opened without it”"
              />
            </Stack>
          </DialogContent>
          <DialogActions>
            <Button onClick={() => setOpen(false)} disabled={update.isPending}>
              Cancel
            </Button>
            <Button type="submit" variant="contained" disabled={update.isPending}>
              {update.isPending ? 'Saving…' : 'Save correction'}
            </Button>
          </DialogActions>
        </form>
      </Dialog>
    </>
  );
}
