import AddIcon from '@mui/icons-material/Add';
import Autocomplete from '@mui/material/Autocomplete';
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
import { useNavigate } from 'react-router-dom';
import type { CreateJobRequest } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import type { FilterOption } from '@/components/ui/select-filter';
import { jobPath } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { useCreateJob, validateCreateJob, type CreateJobErrors } from '../api/create-job';

function today() {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

const optionalNumber = (text: string) => (text.trim() === '' ? null : Number(text.replace(',', '.')));

type Draft = {
  instrument: FilterOption | null;
  receivedDate: string;
  conditionReceived: string;
  technicianId: string;
  ambientTempC: string;
  humidityPct: string;
  notes: string;
};

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
  const titleId = useId();
  const navigate = useNavigate();
  const empty = (): Draft => ({
    instrument: null,
    receivedDate: today(),
    conditionReceived: '',
    technicianId: defaultTechnicianId ? String(defaultTechnicianId) : '',
    ambientTempC: '',
    humidityPct: '',
    notes: '',
  });
  const [open, setOpen] = useState(false);
  const [draft, setDraft] = useState<Draft>(empty);
  const [errors, setErrors] = useState<CreateJobErrors>({});
  const create = useCreateJob({
    onSuccess: (job) => {
      notify('success', `Job ${job.number} opened for ${job.instrumentLabel}.`);
      setOpen(false);
      navigate(jobPath(job.id));
    },
  });

  const set = <K extends keyof Draft>(field: K, value: Draft[K]) => {
    setDraft((current) => ({ ...current, [field]: value }));
    const errorKey = field === 'instrument' ? 'instrumentId' : field;
    setErrors((current) => ({ ...current, [errorKey]: undefined }));
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const request: CreateJobRequest = {
      instrumentId: draft.instrument ? Number(draft.instrument.value) : 0,
      receivedDate: draft.receivedDate,
      conditionReceived: draft.conditionReceived.trim() || null,
      technicianId: draft.technicianId ? Number(draft.technicianId) : null,
      ambientTempC: optionalNumber(draft.ambientTempC),
      humidityPct: optionalNumber(draft.humidityPct),
      notes: draft.notes.trim() || null,
    };
    const found = validateCreateJob(request);
    setErrors(found);
    if (Object.keys(found).length === 0) create.mutate(request);
  };

  const messages = create.error instanceof ApiError ? create.error.messages : create.error ? ['The job could not be opened. Try again.'] : [];

  return (
    <>
      <Button
        variant="contained"
        startIcon={<AddIcon />}
        onClick={() => {
          create.reset();
          setDraft(empty());
          setErrors({});
          setOpen(true);
        }}
      >
        New job
      </Button>
      <Dialog open={open} onClose={create.isPending ? undefined : () => setOpen(false)} aria-labelledby={titleId}>
        <form noValidate onSubmit={submit}>
          <DialogTitle id={titleId}>New job</DialogTitle>
          <DialogContent>
            <FormErrors messages={messages} />
            <Stack spacing={2} sx={{ pt: 1 }}>
              <Autocomplete
                options={instruments}
                value={draft.instrument}
                onChange={(_e, value) => set('instrument', value)}
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
                    autoFocus
                    error={Boolean(errors.instrumentId)}
                    helperText={errors.instrumentId ?? 'Type make, model or serial'}
                  />
                )}
              />
              <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
                <TextField
                  label="Received"
                  type="date"
                  required
                  value={draft.receivedDate}
                  onChange={(e) => set('receivedDate', e.target.value)}
                  error={Boolean(errors.receivedDate)}
                  helperText={errors.receivedDate}
                  slotProps={{ inputLabel: { shrink: true } }}
                />
                <TextField select label="Technician" value={draft.technicianId} onChange={(e) => set('technicianId', e.target.value)}>
                  <MenuItem value="">Not assigned yet</MenuItem>
                  {technicians.map((t) => (
                    <MenuItem key={t.value} value={t.value}>
                      {t.label}
                    </MenuItem>
                  ))}
                </TextField>
              </Box>
              <TextField
                label="Condition as received"
                multiline
                minRows={2}
                value={draft.conditionReceived}
                onChange={(e) => set('conditionReceived', e.target.value)}
                helperText="What you see on the bench: working or not, damage, missing parts"
              />
              <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
                <TextField
                  label="Temperature"
                  value={draft.ambientTempC}
                  onChange={(e) => set('ambientTempC', e.target.value)}
                  error={Boolean(errors.ambientTempC)}
                  helperText={errors.ambientTempC}
                  slotProps={{ input: { endAdornment: <InputAdornment position="end">°C</InputAdornment> }, htmlInput: { inputMode: 'decimal' } }}
                />
                <TextField
                  label="Relative humidity"
                  value={draft.humidityPct}
                  onChange={(e) => set('humidityPct', e.target.value)}
                  error={Boolean(errors.humidityPct)}
                  helperText={errors.humidityPct}
                  slotProps={{ input: { endAdornment: <InputAdornment position="end">%</InputAdornment> }, htmlInput: { inputMode: 'decimal' } }}
                />
              </Box>
              <TextField label="Notes" multiline minRows={1} value={draft.notes} onChange={(e) => set('notes', e.target.value)} />
            </Stack>
          </DialogContent>
          <DialogActions>
            <Button onClick={() => setOpen(false)} disabled={create.isPending}>
              Cancel
            </Button>
            <Button type="submit" variant="contained" disabled={create.isPending}>
              {create.isPending ? 'Opening…' : 'Open job'}
            </Button>
          </DialogActions>
        </form>
      </Dialog>
    </>
  );
}
