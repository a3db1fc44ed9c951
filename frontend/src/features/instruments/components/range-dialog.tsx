import AddIcon from '@mui/icons-material/Add';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { Controller, useFieldArray } from 'react-hook-form';
import { DIAL_UNITS, type DialUnit, type RangeInput } from '@kilocycle/common/types';
import { parseFrequency } from '@kilocycle/common/units';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { numberSx } from '@/components/ui/num';
import { formatHz } from '@/utils/frequency';
import { rangeDraftSchema } from '../api/update-instrument';
import { EMPTY_RANGE, frequencyUnitOf, type RangeDraft } from '../utils/range-draft';

type RangeDialogProps = {
  open: boolean;
  initial: RangeDraft | null;
  busy?: boolean;
  /** The failed save (its messages are listed). */
  error?: unknown;
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

export function RangeDialog({ open, initial, busy, error, onClose, onSave }: RangeDialogProps) {
  const form = useZodForm(rangeDraftSchema, initial ?? EMPTY_RANGE, initial ?? EMPTY_RANGE);
  const { control } = form;
  const rows = useFieldArray({ control, name: 'table' });
  const [dialUnit, lawKind, toleranceKind, table, freqMin, freqMax] = form.watch(['dialUnit', 'lawKind', 'toleranceKind', 'table', 'freqMin', 'freqMax']);
  const errors = form.formState.errors;
  const unitHint = dialUnit === 'div' ? 'Hz' : dialUnit;
  const field = (name: 'dialMin' | 'dialMax' | 'freqMin' | 'freqMax', label: string, helper?: string) => (
    <FormTextField control={control} name={name} label={label} helperText={helper ?? ' '} slotProps={monoInput} />
  );
  const narrow = (name: 'percent' | 'ppm' | 'hz', label: string) => (
    <FormTextField control={control} name={name} label={label} helperText=" " fullWidth={false} sx={{ width: 140 }} slotProps={monoInput} />
  );

  return (
    <FormDialog
      open={open}
      title={initial?.id ? `Range ${initial.label}` : 'New range'}
      form={form}
      onSubmit={onSave}
      onClose={onClose}
      pending={Boolean(busy)}
      error={error}
      errorFallback="The ranges could not be saved."
      submitLabel="Save range"
      pendingLabel="Saving…"
      maxWidth="md"
    >
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: '2fr 1fr' }, gap: 2 }}>
        <FormTextField control={control} name="label" label="Label" required helperText="As marked on the range switch" />
        <FormSelectField
          control={control}
          name="dialUnit"
          label="Dial unit"
          options={DIAL_UNITS.map((unit) => ({ value: unit, label: unit === 'div' ? 'Divisions (plain dial)' : unit }))}
          // A dial marked in divisions has no direct law.
          onValueChange={(unit) => unit === 'div' && form.setValue('lawKind', 'table')}
        />
      </Box>

      <Box>
        <Typography variant="subtitle2" gutterBottom>
          Dial law
        </Typography>
        <Controller
          control={control}
          name="lawKind"
          render={({ field: law }) => (
            <ToggleButtonGroup
              exclusive
              size="small"
              value={law.value}
              onChange={(_e, value: 'direct' | 'table' | null) => value && law.onChange(value)}
              aria-label="Dial law"
            >
              <ToggleButton value="direct" disabled={dialUnit === 'div'}>
                Direct reading
              </ToggleButton>
              <ToggleButton value="table">Table of points</ToggleButton>
            </ToggleButtonGroup>
          )}
        />
        {errors.lawKind && (
          <Typography variant="caption" color="error" sx={{ display: 'block', mt: 0.5 }}>
            {errors.lawKind.message}
          </Typography>
        )}
        {lawKind === 'direct' ? (
          <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
            The dial reads the frequency itself, in {dialUnit}.
          </Typography>
        ) : (
          <Box sx={{ mt: 1 }}>
            <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
              Nominal frequency at marked dial settings; in between it is read by straight lines. A bare number is read in {unitHint}.
            </Typography>
            {rows.fields.map((row, index) => (
              <Box key={row.id} sx={{ display: 'grid', gridTemplateColumns: '1fr 2fr auto', gap: 1, mb: 1, alignItems: 'start' }}>
                <FormTextField control={control} name={`table.${index}.dial`} label={`Dial ${index + 1}`} slotProps={monoInput} />
                <FormTextField
                  control={control}
                  name={`table.${index}.frequency`}
                  label="Frequency"
                  helperText={understood(table[index]?.frequency ?? '', dialUnit)}
                  slotProps={monoInput}
                />
                <IconButton aria-label={`Remove point ${index + 1}`} disabled={rows.fields.length <= 2} onClick={() => rows.remove(index)}>
                  <DeleteOutlined fontSize="small" />
                </IconButton>
              </Box>
            ))}
            <Button size="small" startIcon={<AddIcon />} onClick={() => rows.append({ dial: '', frequency: '' })}>
              Add point
            </Button>
          </Box>
        )}
      </Box>

      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr 1fr', sm: 'repeat(4, 1fr)' }, gap: 2 }}>
        {field('dialMin', `Dial from (${dialUnit})`)}
        {field('dialMax', `Dial to (${dialUnit})`)}
        {field('freqMin', 'Frequency from', understood(freqMin, dialUnit))}
        {field('freqMax', 'Frequency to', understood(freqMax, dialUnit))}
      </Box>

      <Box>
        <Typography variant="subtitle2" gutterBottom>
          Tolerance
        </Typography>
        <Box sx={{ display: 'flex', gap: 2, flexWrap: 'wrap', alignItems: 'flex-start' }}>
          <Controller
            control={control}
            name="toleranceKind"
            render={({ field: kind }) => (
              <ToggleButtonGroup
                exclusive
                size="small"
                value={kind.value}
                onChange={(_e, value: 'percent' | 'ppm_hz' | null) => value && kind.onChange(value)}
                aria-label="Tolerance form"
              >
                <ToggleButton value="percent">% of setting</ToggleButton>
                <ToggleButton value="ppm_hz">ppm + Hz</ToggleButton>
              </ToggleButtonGroup>
            )}
          />
          {toleranceKind === 'percent' ? (
            narrow('percent', '± %')
          ) : (
            <>
              {narrow('ppm', '± ppm')}
              {narrow('hz', '+ Hz')}
            </>
          )}
        </Box>
      </Box>

      <FormTextField
        control={control}
        name="multipliers"
        label="Output multipliers"
        helperText="The harmonics or multiplier stages the owner uses: 1, 2, 4"
        slotProps={monoInput}
      />
    </FormDialog>
  );
}
