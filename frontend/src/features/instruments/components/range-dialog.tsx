import AddIcon from '@mui/icons-material/Add';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import IconButton from '@mui/material/IconButton';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useEffect, useId, useState, type FormEvent } from 'react';
import { DIAL_UNITS, type DialUnit, type RangeInput } from '@kilocycle/common/types';
import { parseFrequency } from '@kilocycle/common/units';
import { FormErrors } from '@/components/ui/form-errors';
import { numberSx } from '@/components/ui/num';
import { formatHz } from '@/utils/frequency';
import { EMPTY_RANGE, frequencyUnitOf, fromDraft, type RangeDraft, type RangeDraftErrors } from '../utils/range-draft';

type RangeDialogProps = {
  open: boolean;
  initial: RangeDraft | null;
  busy?: boolean;
  serverMessages?: readonly string[];
  onClose: () => void;
  onSave: (range: RangeInput) => void;
};

const monoInput = { htmlInput: { style: { fontFamily: numberSx.fontFamily } } };

/** What a typed frequency was read as, or nothing while the field is empty. */
function understood(text: string, unit: DialUnit): string | undefined {
  if (!text.trim()) return undefined;
  try {
    return `= ${formatHz(parseFrequency(text, frequencyUnitOf(unit)))}`;
  } catch {
    return undefined;
  }
}

export function RangeDialog({ open, initial, busy, serverMessages = [], onClose, onSave }: RangeDialogProps) {
  const titleId = useId();
  const [draft, setDraft] = useState<RangeDraft>(initial ?? EMPTY_RANGE);
  const [errors, setErrors] = useState<RangeDraftErrors>({});

  useEffect(() => {
    if (open) {
      setDraft(initial ?? EMPTY_RANGE);
      setErrors({});
    }
  }, [open, initial]);

  const set = <K extends keyof RangeDraft>(field: K, value: RangeDraft[K]) => {
    setDraft((current) => {
      const next = { ...current, [field]: value };
      // A dial marked in divisions has no direct law.
      if (field === 'dialUnit' && value === 'div') next.lawKind = 'table';
      return next;
    });
    setErrors((current) => ({ ...current, [field]: undefined }));
  };

  const setPoint = (index: number, key: 'dial' | 'frequency', value: string) => {
    setDraft((current) => ({ ...current, table: current.table.map((row, i) => (i === index ? { ...row, [key]: value } : row)) }));
    setErrors((current) => ({ ...current, [`table.${index}`]: undefined }));
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const { range, errors: found } = fromDraft(draft);
    setErrors(found);
    if (range) onSave(range);
  };

  const unitHint = draft.dialUnit === 'div' ? 'Hz' : draft.dialUnit;
  const field = (name: 'dialMin' | 'dialMax' | 'freqMin' | 'freqMax', label: string, helper?: string) => (
    <TextField
      label={label}
      value={draft[name]}
      onChange={(e) => set(name, e.target.value)}
      error={Boolean(errors[name])}
      helperText={errors[name] ?? helper ?? ' '}
      slotProps={monoInput}
    />
  );

  return (
    <Dialog open={open} onClose={busy ? undefined : onClose} aria-labelledby={titleId} maxWidth="md">
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>{initial?.id ? `Range ${initial.label}` : 'New range'}</DialogTitle>
        <DialogContent>
          <FormErrors messages={serverMessages} />
          <Stack spacing={2} sx={{ pt: 1 }}>
            <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: '2fr 1fr' }, gap: 2 }}>
              <TextField
                label="Label"
                required
                autoFocus
                value={draft.label}
                onChange={(e) => set('label', e.target.value)}
                error={Boolean(errors.label)}
                helperText={errors.label ?? 'As marked on the range switch'}
              />
              <TextField select label="Dial unit" value={draft.dialUnit} onChange={(e) => set('dialUnit', e.target.value as DialUnit)}>
                {DIAL_UNITS.map((unit) => (
                  <MenuItem key={unit} value={unit}>
                    {unit === 'div' ? 'Divisions (plain dial)' : unit}
                  </MenuItem>
                ))}
              </TextField>
            </Box>

            <Box>
              <Typography variant="subtitle2" gutterBottom>
                Dial law
              </Typography>
              <ToggleButtonGroup
                exclusive
                size="small"
                value={draft.lawKind}
                onChange={(_e, value: 'direct' | 'table' | null) => value && set('lawKind', value)}
                aria-label="Dial law"
              >
                <ToggleButton value="direct" disabled={draft.dialUnit === 'div'}>
                  Direct reading
                </ToggleButton>
                <ToggleButton value="table">Table of points</ToggleButton>
              </ToggleButtonGroup>
              {errors.lawKind && (
                <Typography variant="caption" color="error" sx={{ display: 'block', mt: 0.5 }}>
                  {errors.lawKind}
                </Typography>
              )}
              {draft.lawKind === 'direct' ? (
                <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
                  The dial reads the frequency itself, in {draft.dialUnit}.
                </Typography>
              ) : (
                <Box sx={{ mt: 1 }}>
                  <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
                    Nominal frequency at marked dial settings; in between it is read by straight lines. A bare number is
                    read in {unitHint}.
                  </Typography>
                  {draft.table.map((row, index) => (
                    <Box key={index} sx={{ display: 'grid', gridTemplateColumns: '1fr 2fr auto', gap: 1, mb: 1, alignItems: 'start' }}>
                      <TextField
                        label={`Dial ${index + 1}`}
                        value={row.dial}
                        onChange={(e) => setPoint(index, 'dial', e.target.value)}
                        slotProps={monoInput}
                      />
                      <TextField
                        label="Frequency"
                        value={row.frequency}
                        onChange={(e) => setPoint(index, 'frequency', e.target.value)}
                        error={Boolean(errors[`table.${index}`])}
                        helperText={errors[`table.${index}`] ?? understood(row.frequency, draft.dialUnit)}
                        slotProps={monoInput}
                      />
                      <IconButton
                        aria-label={`Remove point ${index + 1}`}
                        disabled={draft.table.length <= 2}
                        onClick={() => set('table', draft.table.filter((_, i) => i !== index))}
                      >
                        <DeleteOutlined fontSize="small" />
                      </IconButton>
                    </Box>
                  ))}
                  <Button size="small" startIcon={<AddIcon />} onClick={() => set('table', [...draft.table, { dial: '', frequency: '' }])}>
                    Add point
                  </Button>
                </Box>
              )}
            </Box>

            <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr 1fr', sm: 'repeat(4, 1fr)' }, gap: 2 }}>
              {field('dialMin', `Dial from (${draft.dialUnit})`)}
              {field('dialMax', `Dial to (${draft.dialUnit})`)}
              {field('freqMin', 'Frequency from', understood(draft.freqMin, draft.dialUnit))}
              {field('freqMax', 'Frequency to', understood(draft.freqMax, draft.dialUnit))}
            </Box>

            <Box>
              <Typography variant="subtitle2" gutterBottom>
                Tolerance
              </Typography>
              <Box sx={{ display: 'flex', gap: 2, flexWrap: 'wrap', alignItems: 'flex-start' }}>
                <ToggleButtonGroup
                  exclusive
                  size="small"
                  value={draft.toleranceKind}
                  onChange={(_e, value: 'percent' | 'ppm_hz' | null) => value && set('toleranceKind', value)}
                  aria-label="Tolerance form"
                >
                  <ToggleButton value="percent">% of setting</ToggleButton>
                  <ToggleButton value="ppm_hz">ppm + Hz</ToggleButton>
                </ToggleButtonGroup>
                {draft.toleranceKind === 'percent' ? (
                  <TextField
                    label="± %"
                    value={draft.percent}
                    onChange={(e) => set('percent', e.target.value)}
                    error={Boolean(errors.percent)}
                    helperText={errors.percent ?? ' '}
                    fullWidth={false}
                    sx={{ width: 140 }}
                    slotProps={monoInput}
                  />
                ) : (
                  <>
                    <TextField
                      label="± ppm"
                      value={draft.ppm}
                      onChange={(e) => set('ppm', e.target.value)}
                      error={Boolean(errors.ppm)}
                      helperText={errors.ppm ?? ' '}
                      fullWidth={false}
                      sx={{ width: 140 }}
                      slotProps={monoInput}
                    />
                    <TextField
                      label="+ Hz"
                      value={draft.hz}
                      onChange={(e) => set('hz', e.target.value)}
                      error={Boolean(errors.hz)}
                      helperText={errors.hz ?? ' '}
                      fullWidth={false}
                      sx={{ width: 140 }}
                      slotProps={monoInput}
                    />
                  </>
                )}
              </Box>
            </Box>

            <TextField
              label="Output multipliers"
              value={draft.multipliers}
              onChange={(e) => set('multipliers', e.target.value)}
              error={Boolean(errors.multipliers)}
              helperText={errors.multipliers ?? 'The harmonics or multiplier stages the owner uses: 1, 2, 4'}
              slotProps={monoInput}
            />
          </Stack>
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose} disabled={busy}>
            Cancel
          </Button>
          <Button type="submit" variant="contained" disabled={busy}>
            {busy ? 'Saving…' : 'Save range'}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}
