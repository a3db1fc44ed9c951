import AddIcon from '@mui/icons-material/Add';
import Autocomplete from '@mui/material/Autocomplete';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import InputAdornment from '@mui/material/InputAdornment';
import TextField from '@mui/material/TextField';
import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import type { FilterOption } from '@/components/ui/select-filter';
import { jobPath } from '@/config/paths';
import { notify } from '@/lib/notifications';
import { createJobSchema, useCreateJob } from '../api/create-job';

function today() {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

const unit = (text: string) => ({
  input: { endAdornment: <InputAdornment position="end">{text}</InputAdornment> },
  htmlInput: { inputMode: 'decimal' as const },
});

type CreateJobProps = {
  /** Instruments matching what was typed in the picker (the route searches the API). */
  instruments: readonly FilterOption[];
  instrumentsLoading?: boolean;
  onInstrumentSearch: (text: string) => void;
  technicians: readonly FilterOption[];
  defaultTechnicianId?: number;
};

/** "New job": an instrument comes in; who has it, in what state, and the bench conditions. */
export function CreateJob({ instruments, instrumentsLoading, onInstrumentSearch, technicians, defaultTechnicianId }: CreateJobProps) {
  const navigate = useNavigate();
  const empty = () => ({
    instrument: null,
    receivedDate: today(),
    conditionReceived: '',
    technicianId: defaultTechnicianId ? String(defaultTechnicianId) : '',
    ambientTempC: '',
    humidityPct: '',
    notes: '',
  });
  const [open, setOpen] = useState(false);
  const form = useZodForm(createJobSchema, empty());
  const create = useCreateJob({
    onSuccess: (job) => {
      notify('success', `Job ${job.number} opened for ${job.instrumentLabel}.`);
      setOpen(false);
      navigate(jobPath(job.id));
    },
  });
  const technicianOptions = [{ value: '', label: 'Not assigned yet' }, ...technicians.map((t) => ({ value: String(t.value), label: t.label }))];

  return (
    <>
      <Button
        variant="contained"
        startIcon={<AddIcon />}
        onClick={() => {
          create.reset();
          form.reset(empty());
          setOpen(true);
        }}
      >
        New job
      </Button>
      <FormDialog
        open={open}
        title="New job"
        form={form}
        onSubmit={(request) => create.mutate(request)}
        onClose={() => setOpen(false)}
        pending={create.isPending}
        error={create.error}
        errorFallback="The job could not be opened. Try again."
        submitLabel="Open job"
        pendingLabel="Opening…"
      >
        <Controller
          control={form.control}
          name="instrument"
          render={({ field, fieldState }) => (
            <Autocomplete
              options={instruments}
              value={field.value as FilterOption | null}
              onChange={(_e, value) => field.onChange(value)}
              onInputChange={(_e, text, reason) => reason === 'input' && onInstrumentSearch(text)}
              isOptionEqualToValue={(a, b) => a.value === b.value}
              getOptionLabel={(o) => o.label}
              filterOptions={(x) => x}
              loading={instrumentsLoading}
              renderInput={(params) => (
                <TextField
                  {...params}
                  label="Instrument"
                  required
                  error={Boolean(fieldState.error)}
                  helperText={fieldState.error?.message ?? 'Type make, model or serial'}
                />
              )}
            />
          )}
        />
        <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
          <FormTextField control={form.control} name="receivedDate" label="Received" type="date" required slotProps={{ inputLabel: { shrink: true } }} />
          <FormSelectField control={form.control} name="technicianId" label="Technician" options={technicianOptions} />
        </Box>
        <FormTextField
          control={form.control}
          name="conditionReceived"
          label="Condition as received"
          multiline
          minRows={2}
          helperText="What you see on the bench: working or not, damage, missing parts"
        />
        <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
          <FormTextField control={form.control} name="ambientTempC" label="Temperature" slotProps={unit('°C')} />
          <FormTextField control={form.control} name="humidityPct" label="Relative humidity" slotProps={unit('%')} />
        </Box>
        <FormTextField control={form.control} name="notes" label="Notes" multiline minRows={1} />
      </FormDialog>
    </>
  );
}
