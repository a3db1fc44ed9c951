import PlayArrowOutlined from '@mui/icons-material/PlayArrowOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import InputAdornment from '@mui/material/InputAdornment';
import MenuItem from '@mui/material/MenuItem';
import { useState } from 'react';
import { PHASE_RUN_KINDS } from '@kilocycle/common/rules';
import { CALIBRATION_RUN_KINDS, RUN_DATA_KINDS, RUN_KINDS, type Role, type Run, type RunDataKind, type RunKind } from '@kilocycle/common/types';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { ApiError } from '@/lib/api-client';
import { DATA_KIND_CHOICES } from '@/utils/data-kind';
import { openRunSchema, useOpenRun } from '../api/open-run';
import { RUN_KIND_LABELS } from './run-labels';

const STUDY_KINDS: readonly RunKind[] = ['warmup', 'stability', 'supply_sensitivity', 'keying'];

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
export function preselectedStandard(
  benches: readonly BenchChoice[],
  benchId: string,
  standards: readonly StandardChoice[],
): { id: string; bench: string } | null {
  const bench = benchId ? benches.find((b) => b.value === benchId) : benches.find((b) => b.defaultStandardId !== null);
  const id = bench?.defaultStandardId ?? null;
  if (!bench || id === null || !standards.some((s) => s.value === id)) return null;
  return { id, bench: bench.label };
}

/**
 * "Open run": range, kind (with, for a stability run, what its readings hold: frequency or phase), bench and standard. The bench's default standard is pre-selected; an
 * as-found or as-left run must have one (no "None" for those kinds). A lapsed standard is refused
 * unless a lead gives a written reason.
 */
export function OpenRunDialog({ jobId, role, ranges, benches, standards, onOpened }: OpenRunDialogProps) {
  const kinds = kindsFor(role);
  const blank = () => ({
    rangeId: ranges[0]?.value ?? '',
    kind: kinds[0] ?? 'as_found',
    dataKind: 'frequency' as RunDataKind,
    benchId: '',
    standardId: preselectedStandard(benches, '', standards)?.id ?? '',
    supplyVoltage: '',
    configuration: '',
    notes: '',
    overrideReason: '',
  });
  const [open, setOpen] = useState(false);
  // Once the person picks a standard, choosing a bench no longer replaces it with the bench's default.
  const [standardChosen, setStandardChosen] = useState(false);
  const openRun = useOpenRun({
    onSuccess: (run) => {
      setOpen(false);
      onOpened(run);
    },
  });

  const error = openRun.error;
  const conflict = error instanceof ApiError && error.status === 409 ? error.message : null;
  const lapsedStandard = (id: string) => Boolean(standards.find((s) => s.value === id)?.overdue) || Boolean(conflict && /due for calibration/i.test(conflict));
  const form = useZodForm(
    openRunSchema((id) => role === 'lead' && lapsedStandard(id === null ? '' : String(id))),
    blank(),
  );
  const [kind, benchId, standardId] = form.watch(['kind', 'benchId', 'standardId']);
  const needsStandard = CALIBRATION_RUN_KINDS.includes(kind);
  const preselected = preselectedStandard(benches, benchId, standards);
  const lapsed = lapsedStandard(standardId);
  const askReason = role === 'lead' && lapsed;

  // A bench brings its default standard, unless one was picked; an as-found or as-left run gets it when none is set.
  const benchChanged = (next: string) => {
    const standard = preselectedStandard(benches, next, standards)?.id;
    if (!standardChosen && standard) form.setValue('standardId', standard);
  };
  const kindChanged = (next: string) => {
    const standard = preselectedStandard(benches, form.getValues('benchId'), standards)?.id;
    if (CALIBRATION_RUN_KINDS.includes(next as RunKind) && !form.getValues('standardId') && standard) form.setValue('standardId', standard);
  };

  if (kinds.length === 0) return null;

  const standardHelp =
    preselected && preselected.id === standardId
      ? `${preselected.bench}’s default standard${needsStandard ? ' (as-found and as-left runs need one)' : ''}`
      : needsStandard
        ? 'Required: as-found and as-left results are stated against it'
        : benchId
          ? 'Empty: the bench’s default standard'
          : 'The counter or reference measured against';
  const standardOptions = [
    ...(needsStandard ? [] : [{ value: '', label: benchId ? 'The bench’s default' : 'None' }]),
    ...standards.map((s) => ({ value: s.value, label: `${s.label}${s.overdue ? ' — calibration overdue' : ''}` })),
  ];

  return (
    <>
      <Button
        variant="contained"
        startIcon={<PlayArrowOutlined />}
        disabled={ranges.length === 0}
        onClick={() => {
          openRun.reset();
          form.reset(blank());
          setStandardChosen(false);
          setOpen(true);
        }}
      >
        Open run
      </Button>
      <FormDialog
        open={open}
        title="Open a run"
        form={form}
        onSubmit={(body) => openRun.mutate({ jobId, body })}
        onClose={() => setOpen(false)}
        pending={openRun.isPending}
        error={conflict ? null : error}
        errorFallback="The run could not be opened."
        submitLabel={askReason ? 'Open with override' : 'Open run'}
        pendingLabel="Opening…"
      >
        {conflict && (
          <Alert severity="warning" role="alert">
            {conflict}
          </Alert>
        )}
        <Box sx={{ display: 'grid', gridTemplateColumns: '2fr 1fr', gap: 2 }}>
          <FormTextField control={form.control} name="rangeId" label="Range" required select>
            {ranges.map((r) => (
              <MenuItem key={r.value} value={r.value} sx={{ whiteSpace: 'pre' }}>
                {r.label}
              </MenuItem>
            ))}
          </FormTextField>
          <FormSelectField
            control={form.control}
            name="kind"
            label="Kind"
            required
            options={kinds.map((k) => ({ value: k, label: RUN_KIND_LABELS[k] }))}
            onValueChange={kindChanged}
          />
          <FormSelectField
            control={form.control}
            name="benchId"
            label="Bench"
            helperText="Needed to stream from the bridge"
            options={[{ value: '', label: 'No bench (typed readings)' }, ...benches]}
            onValueChange={benchChanged}
          />
          <FormTextField
            control={form.control}
            name="supplyVoltage"
            label="Supply voltage"
            slotProps={{ input: { endAdornment: <InputAdornment position="end">V</InputAdornment> }, htmlInput: { inputMode: 'decimal' } }}
          />
        </Box>
        {PHASE_RUN_KINDS.includes(kind) && (
          <FormSelectField
            control={form.control}
            name="dataKind"
            label="Data"
            required
            helperText="What the readings hold; a run keeps one kind"
            options={RUN_DATA_KINDS.map((k) => ({ value: k, label: DATA_KIND_CHOICES[k] }))}
          />
        )}
        <FormSelectField
          control={form.control}
          name="standardId"
          label="Reference standard"
          required={needsStandard}
          helperText={standardHelp}
          options={standardOptions}
          onValueChange={() => setStandardChosen(true)}
        />
        {lapsed && role !== 'lead' && !conflict && (
          <Alert severity="warning">This standard is past its due date: only a lead can use it, with a written reason.</Alert>
        )}
        {askReason && (
          <FormTextField
            control={form.control}
            name="overrideReason"
            label="Why the lapsed standard is used"
            required
            multiline
            minRows={2}
            helperText="Kept in the audit log with your name"
          />
        )}
        <FormTextField control={form.control} name="configuration" label="Configuration" helperText="In or out of its case, warm-up, load, gate time…" />
        <FormTextField control={form.control} name="notes" label="Notes" />
      </FormDialog>
    </>
  );
}
