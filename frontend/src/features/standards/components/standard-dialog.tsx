import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControlLabel from '@mui/material/FormControlLabel';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import Switch from '@mui/material/Switch';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useId, useState, type FormEvent } from 'react';
import { STANDARD_KINDS, type CreateStandardRequest, type ReferenceStandard, type StandardKind } from '@kilocycle/common/types';
import { parseNumber } from '@kilocycle/common/units';
import { FormErrors } from '@/components/ui/form-errors';
import { numberSx } from '@/components/ui/num';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { useCreateStandard } from '../api/create-standard';
import { useUpdateStandard } from '../api/update-standard';

export const STANDARD_KIND_LABELS: Record<StandardKind, string> = { counter: 'Frequency counter', reference: 'Frequency reference' };

type Draft = Record<'name' | 'makeModel' | 'serial' | 'certificateNumber' | 'dueDate' | 'timebaseAccuracyPpm' | 'resolutionHz' | 'calibrationUPpm' | 'calibrationK', string> & {
  kind: StandardKind;
  active: boolean;
};

const EMPTY: Draft = {
  name: '',
  kind: 'counter',
  makeModel: '',
  serial: '',
  certificateNumber: '',
  dueDate: '',
  timebaseAccuracyPpm: '',
  resolutionHz: '',
  calibrationUPpm: '',
  calibrationK: '2',
  active: true,
};

function fromStandard(s: ReferenceStandard): Draft {
  return {
    name: s.name,
    kind: s.kind,
    makeModel: s.makeModel,
    serial: s.serial,
    certificateNumber: s.certificateNumber,
    dueDate: s.dueDate.slice(0, 10),
    timebaseAccuracyPpm: String(s.timebaseAccuracyPpm),
    resolutionHz: String(s.resolutionHz),
    calibrationUPpm: String(s.calibrationUPpm),
    calibrationK: String(s.calibrationK),
    active: s.active,
  };
}

type Errors = Partial<Record<keyof Draft, string>>;

function read(draft: Draft): { body: CreateStandardRequest | null; errors: Errors } {
  const errors: Errors = {};
  const text = (field: 'name' | 'makeModel' | 'serial' | 'certificateNumber', message: string) => {
    if (!draft[field].trim()) errors[field] = message;
    return draft[field].trim();
  };
  const number = (field: 'timebaseAccuracyPpm' | 'resolutionHz' | 'calibrationUPpm' | 'calibrationK', check: (n: number) => string | null) => {
    try {
      const n = parseNumber(draft[field]);
      const problem = check(n);
      if (problem) errors[field] = problem;
      return n;
    } catch (error) {
      errors[field] = error instanceof Error ? error.message : 'Not a number';
      return NaN;
    }
  };
  const body: CreateStandardRequest = {
    name: text('name', 'Give it the name the bench knows it by'),
    kind: draft.kind,
    makeModel: text('makeModel', 'Enter make and model'),
    serial: text('serial', 'Enter the serial number'),
    certificateNumber: text('certificateNumber', 'Enter the number of its own certificate'),
    dueDate: draft.dueDate,
    timebaseAccuracyPpm: number('timebaseAccuracyPpm', (n) => (n < 0 || n > 1000 ? '0 to 1000 ppm' : null)),
    resolutionHz: number('resolutionHz', (n) => (n <= 0 ? 'Above 0 Hz' : null)),
    calibrationUPpm: number('calibrationUPpm', (n) => (n < 0 || n > 1000 ? '0 to 1000 ppm' : null)),
    calibrationK: number('calibrationK', (n) => (n < 1 || n > 10 ? '1 to 10' : null)),
  };
  if (!/^\d{4}-\d{2}-\d{2}$/.test(draft.dueDate)) errors.dueDate = 'Enter the date its calibration is due';
  return { body: Object.keys(errors).length ? null : body, errors };
}

type StandardDialogProps = { open: boolean; standard: ReferenceStandard | null; onClose: () => void };

/** Create a reference standard, or change one (leads and administrators). */
export function StandardDialog({ open, standard, onClose }: StandardDialogProps) {
  const titleId = useId();
  const [draft, setDraft] = useState<Draft>(standard ? fromStandard(standard) : EMPTY);
  const [errors, setErrors] = useState<Errors>({});
  const [shownFor, setShownFor] = useState<{ open: boolean; standard: ReferenceStandard | null }>({ open, standard });
  if (shownFor.open !== open || shownFor.standard !== standard) {
    setShownFor({ open, standard });
    if (open) {
      setDraft(standard ? fromStandard(standard) : EMPTY);
      setErrors({});
    }
  }
  const done = (saved: ReferenceStandard) => {
    notify('success', `${saved.name} saved.`);
    onClose();
  };
  const create = useCreateStandard({ onSuccess: done });
  const update = useUpdateStandard({ onSuccess: done });
  const busy = create.isPending || update.isPending;
  const error = create.error ?? update.error;
  const messages = error instanceof ApiError ? error.messages : error ? ['The standard could not be saved.'] : [];

  const set = <K extends keyof Draft>(field: K, value: Draft[K]) => {
    setDraft((current) => ({ ...current, [field]: value }));
    setErrors((current) => ({ ...current, [field]: undefined }));
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const { body, errors: found } = read(draft);
    setErrors(found);
    if (!body) return;
    if (standard) update.mutate({ id: standard.id, changes: { ...body, active: draft.active } });
    else create.mutate(body);
  };

  const mono = { htmlInput: { style: { fontFamily: numberSx.fontFamily } } };
  const textField = (field: keyof Draft & string, label: string, props: { helper?: string; autoFocus?: boolean; mono?: boolean } = {}) => (
    <TextField
      label={label}
      autoFocus={props.autoFocus}
      value={draft[field] as string}
      onChange={(e) => set(field, e.target.value as never)}
      error={Boolean(errors[field])}
      helperText={errors[field] ?? props.helper}
      slotProps={props.mono ? mono : undefined}
    />
  );

  return (
    <Dialog
      open={open}
      onClose={busy ? undefined : onClose}
      aria-labelledby={titleId}
      slotProps={{
        transition: {
          onExited: () => {
            create.reset();
            update.reset();
          },
        },
      }}
    >
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>{standard ? `Edit ${standard.name} (version ${standard.version})` : 'New reference standard'}</DialogTitle>
        <DialogContent>
          <FormErrors messages={messages} />
          {standard && (
            <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
              Saving a change makes version {standard.version + 1}. Open jobs use it at once; signed jobs keep the version they were signed with.
            </Typography>
          )}
          <Stack spacing={2} sx={{ pt: 1 }}>
            <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
              {textField('name', 'Name', { autoFocus: true, helper: 'As the bench knows it, e.g. Bench counter A' })}
              <TextField select label="Kind" value={draft.kind} onChange={(e) => set('kind', e.target.value as StandardKind)}>
                {STANDARD_KINDS.map((kind) => (
                  <MenuItem key={kind} value={kind}>
                    {STANDARD_KIND_LABELS[kind]}
                  </MenuItem>
                ))}
              </TextField>
              {textField('makeModel', 'Make and model')}
              {textField('serial', 'Serial number', { mono: true })}
              {textField('certificateNumber', 'Its certificate number', { mono: true })}
              <TextField
                label="Calibration due"
                type="date"
                value={draft.dueDate}
                onChange={(e) => set('dueDate', e.target.value)}
                error={Boolean(errors.dueDate)}
                helperText={errors.dueDate}
                slotProps={{ inputLabel: { shrink: true } }}
              />
              {textField('timebaseAccuracyPpm', 'Time-base accuracy (± ppm)', { mono: true })}
              {textField('resolutionHz', 'Resolution (Hz, one count)', { mono: true })}
              {textField('calibrationUPpm', 'Its calibration U (ppm)', { mono: true, helper: 'Expanded uncertainty from its certificate' })}
              {textField('calibrationK', 'Coverage factor k', { mono: true })}
            </Box>
            {standard && (
              <FormControlLabel
                control={<Switch checked={draft.active} onChange={(e) => set('active', e.target.checked)} />}
                label="In use (a standard out of use cannot be chosen for new runs)"
              />
            )}
          </Stack>
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose} disabled={busy}>
            Cancel
          </Button>
          <Button type="submit" variant="contained" disabled={busy}>
            {busy ? 'Saving…' : standard ? 'Save' : 'Create standard'}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
