import PlayArrowOutlined from '@mui/icons-material/PlayArrowOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import InputAdornment from '@mui/material/InputAdornment';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import { useId, useState, type FormEvent } from 'react';
import { CALIBRATION_RUN_KINDS, RUN_KINDS, type CreateRunRequest, type Role, type Run, type RunKind } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import { ApiError } from '@/lib/api-client';
import { useOpenRun } from '../api/open-run';
import { RUN_KIND_LABELS } from './run-labels';

const STUDY_KINDS: readonly RunKind[] = ['warmup', 'stability', 'supply_sensitivity', 'keying'];
const MIN_OVERRIDE_REASON = 10;

export type StandardChoice = { value: string; label: string; overdue: boolean };
export type Choice = { value: string; label: string };
/** A bench, with the standard it measures against unless told otherwise. */
export type BenchChoice = Choice & { defaultStandardId: string | null };

/** The run kinds a role may open: engineers run studies, not calibrations. */
export function kindsFor(role: Role): readonly RunKind[] {
  if (role === 'engineer') return STUDY_KINDS;
  if (role === 'client') return [];
  return RUN_KINDS;
}

type OpenRunDialogProps = {
  jobId: number;
  role: Role;
  ranges: readonly Choice[];
  benches: readonly BenchChoice[];
  standards: readonly StandardChoice[];
  onOpened: (run: Run) => void;
};

/**
 * The standard to pre-select: the chosen bench's default, or with no bench chosen the default of the
 * first bench that has one (a lab measures typed readings with its bench counter too).
 */
export function preselectedStandard(benches: readonly BenchChoice[], benchId: string, standards: readonly StandardChoice[]): { id: string; bench: string } | null {
  const bench = benchId ? benches.find((b) => b.value === benchId) : benches.find((b) => b.defaultStandardId !== null);
  const id = bench?.defaultStandardId ?? null;
  if (!bench || id === null || !standards.some((s) => s.value === id)) return null;
  return { id, bench: bench.label };
}

/**
 * "Open run": range, kind, bench and standard. The bench's default standard is pre-selected; an
 * as-found or as-left run must have one (no "None" for those kinds). A lapsed standard is refused
 * unless a lead gives a written reason.
 */
export function OpenRunDialog({ jobId, role, ranges, benches, standards, onOpened }: OpenRunDialogProps) {
  const titleId = useId();
  const kinds = kindsFor(role);
  const blank = () => ({
    rangeId: ranges[0]?.value ?? '',
    kind: kinds[0] ?? 'as_found',
    benchId: '',
    standardId: preselectedStandard(benches, '', standards)?.id ?? '',
    supplyVoltage: '',
    configuration: '',
    notes: '',
    overrideReason: '',
  });
  const [open, setOpen] = useState(false);
  const [draft, setDraft] = useState(blank);
  const [problem, setProblem] = useState<string | null>(null);
  // Once the person picks a standard, choosing a bench no longer replaces it with the bench's default.
  const [standardChosen, setStandardChosen] = useState(false);
  const openRun = useOpenRun({
    onSuccess: (run) => {
      setOpen(false);
      onOpened(run);
    },
  });

  const set = (field: keyof ReturnType<typeof blank>, value: string) => {
    setDraft((d) => {
      const next = { ...d, [field]: value };
      if (field === 'standardId') return next;
      const preselected = preselectedStandard(benches, next.benchId, standards)?.id;
      if (field === 'benchId' && !standardChosen && preselected) next.standardId = preselected;
      if (field === 'kind' && CALIBRATION_RUN_KINDS.includes(value as RunKind) && !next.standardId && preselected) next.standardId = preselected;
      return next;
    });
    if (field === 'standardId') setStandardChosen(true);
    setProblem(null);
  };
  const needsStandard = CALIBRATION_RUN_KINDS.includes(draft.kind as RunKind);
  const preselected = preselectedStandard(benches, draft.benchId, standards);

  const error = openRun.error;
  const conflict = error instanceof ApiError && error.status === 409 ? error.message : null;
  const chosenStandard = standards.find((s) => s.value === draft.standardId);
  const lapsed = Boolean(chosenStandard?.overdue) || Boolean(conflict && /due for calibration/i.test(conflict));
  const askReason = role === 'lead' && lapsed;

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (!draft.rangeId) return setProblem('Choose the range');
    const volts = draft.supplyVoltage.trim() === '' ? null : Number(draft.supplyVoltage.replace(',', '.'));
    if (volts !== null && !(volts >= 0)) return setProblem('The supply voltage is a number of volts');
    const reason = draft.overrideReason.trim();
    if (needsStandard && !draft.standardId) return setProblem('Choose the reference standard: as-found and as-left results are stated against it');
    if (askReason && reason.length < MIN_OVERRIDE_REASON) return setProblem(`Write why the lapsed standard is used (at least ${MIN_OVERRIDE_REASON} characters)`);
    const body: CreateRunRequest = {
      rangeId: Number(draft.rangeId),
      kind: draft.kind as RunKind,
      benchId: draft.benchId ? Number(draft.benchId) : null,
      standardId: draft.standardId ? Number(draft.standardId) : null,
      supplyVoltage: volts,
      configuration: draft.configuration.trim() || null,
      notes: draft.notes.trim() || null,
      ...(askReason ? { standardOverrideReason: reason } : {}),
    };
    openRun.mutate({ jobId, body });
  };

  if (kinds.length === 0) return null;

  return (
    <>
      <Button
        variant="contained"
        startIcon={<PlayArrowOutlined />}
        disabled={ranges.length === 0}
        onClick={() => {
          openRun.reset();
          setDraft(blank());
          setStandardChosen(false);
          setProblem(null);
          setOpen(true);
        }}
      >
        Open run
      </Button>
      <Dialog open={open} onClose={openRun.isPending ? undefined : () => setOpen(false)} aria-labelledby={titleId}>
        <form noValidate onSubmit={submit}>
          <DialogTitle id={titleId}>Open a run</DialogTitle>
          <DialogContent>
            {conflict ? (
              <Alert severity="warning" role="alert" sx={{ mb: 2 }}>
                {conflict}
              </Alert>
            ) : (
              <FormErrors messages={error instanceof ApiError ? error.messages : error ? ['The run could not be opened.'] : []} />
            )}
            {problem && (
              <Alert severity="error" role="alert" sx={{ mb: 2 }}>
                {problem}
              </Alert>
            )}
            <Stack spacing={2} sx={{ pt: 1 }}>
              <Box sx={{ display: 'grid', gridTemplateColumns: '2fr 1fr', gap: 2 }}>
                <TextField select label="Range" required value={draft.rangeId} onChange={(e) => set('rangeId', e.target.value)}>
                  {ranges.map((r) => (
                    <MenuItem key={r.value} value={r.value} sx={{ whiteSpace: 'pre' }}>
                      {r.label}
                    </MenuItem>
                  ))}
                </TextField>
                <TextField select label="Kind" required value={draft.kind} onChange={(e) => set('kind', e.target.value)}>
                  {kinds.map((k) => (
                    <MenuItem key={k} value={k}>
                      {RUN_KIND_LABELS[k]}
                    </MenuItem>
                  ))}
                </TextField>
                <TextField select label="Bench" value={draft.benchId} onChange={(e) => set('benchId', e.target.value)} helperText="Needed to stream from the bridge">
                  <MenuItem value="">No bench (typed readings)</MenuItem>
                  {benches.map((b) => (
                    <MenuItem key={b.value} value={b.value}>
                      {b.label}
                    </MenuItem>
                  ))}
                </TextField>
                <TextField
                  label="Supply voltage"
                  value={draft.supplyVoltage}
                  onChange={(e) => set('supplyVoltage', e.target.value)}
                  slotProps={{ input: { endAdornment: <InputAdornment position="end">V</InputAdornment> }, htmlInput: { inputMode: 'decimal' } }}
                />
              </Box>
              <TextField
                select
                label="Reference standard"
                required={needsStandard}
                value={draft.standardId}
                onChange={(e) => set('standardId', e.target.value)}
                helperText={
                  preselected && preselected.id === draft.standardId
                    ? `${preselected.bench}’s default standard${needsStandard ? ' (as-found and as-left runs need one)' : ''}`
                    : needsStandard
                      ? 'Required: as-found and as-left results are stated against it'
                      : draft.benchId
                        ? 'Empty: the bench’s default standard'
                        : 'The counter or reference measured against'
                }
              >
                {!needsStandard && <MenuItem value="">{draft.benchId ? 'The bench’s default' : 'None'}</MenuItem>}
                {standards.map((s) => (
                  <MenuItem key={s.value} value={s.value}>
                    {s.label}
                    {s.overdue ? ' — calibration overdue' : ''}
                  </MenuItem>
                ))}
              </TextField>
              {lapsed && role !== 'lead' && !conflict && (
                <Alert severity="warning">This standard is past its due date: only a lead can use it, with a written reason.</Alert>
              )}
              {askReason && (
                <TextField
                  label="Why the lapsed standard is used"
                  required
                  multiline
                  minRows={2}
                  value={draft.overrideReason}
                  onChange={(e) => set('overrideReason', e.target.value)}
                  helperText="Kept in the audit log with your name"
                />
              )}
              <TextField
                label="Configuration"
                value={draft.configuration}
                onChange={(e) => set('configuration', e.target.value)}
                helperText="In or out of its case, warm-up, load, gate time…"
              />
              <TextField label="Notes" value={draft.notes} onChange={(e) => set('notes', e.target.value)} />
            </Stack>
          </DialogContent>
          <DialogActions>
            <Button onClick={() => setOpen(false)} disabled={openRun.isPending}>
              Cancel
            </Button>
            <Button type="submit" variant="contained" disabled={openRun.isPending}>
              {openRun.isPending ? 'Opening…' : askReason ? 'Open with override' : 'Open run'}
            </Button>
          </DialogActions>
        </form>
      </Dialog>
    </>
  );
}
