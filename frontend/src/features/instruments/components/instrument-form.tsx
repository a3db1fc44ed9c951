import AddIcon from '@mui/icons-material/Add';
import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import { useId, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import type { CreateInstrumentRequest, Instrument } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import type { FilterOption } from '@/components/ui/select-filter';
import { instrumentPath } from '@/config/paths';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { useCreateInstrument, validateCreateInstrument, type CreateInstrumentErrors } from '../api/create-instrument';
import { useUpdateInstrument } from '../api/update-instrument';

type Draft = {
  organizationId: string;
  make: string;
  model: string;
  serial: string;
  assetTag: string;
  description: string;
  recallIntervalMonths: string;
  nextDueDate: string;
};

const EMPTY: Draft = {
  organizationId: '',
  make: '',
  model: '',
  serial: '',
  assetTag: '',
  description: '',
  recallIntervalMonths: '12',
  nextDueDate: '',
};

function fromInstrument(i: Instrument): Draft {
  return {
    organizationId: String(i.organizationId),
    make: i.make,
    model: i.model,
    serial: i.serial,
    assetTag: i.assetTag ?? '',
    description: i.description ?? '',
    recallIntervalMonths: String(i.recallIntervalMonths),
    nextDueDate: i.nextDueDate ?? '',
  };
}

function toRequest(d: Draft): CreateInstrumentRequest {
  return {
    organizationId: Number(d.organizationId) || 0,
    make: d.make.trim(),
    model: d.model.trim(),
    serial: d.serial.trim(),
    assetTag: d.assetTag.trim() || null,
    description: d.description.trim() || null,
    recallIntervalMonths: d.recallIntervalMonths.trim() === '' ? undefined : Number(d.recallIntervalMonths),
    nextDueDate: d.nextDueDate || null,
  };
}

type FormProps = {
  open: boolean;
  title: string;
  initial: Draft;
  owners?: readonly FilterOption[];
  busy: boolean;
  error: unknown;
  submitLabel: string;
  onClose: () => void;
  onSubmit: (request: CreateInstrumentRequest) => void;
};

function InstrumentFormDialog({ open, title, initial, owners, busy, error, submitLabel, onClose, onSubmit }: FormProps) {
  const titleId = useId();
  const [draft, setDraft] = useState<Draft>(initial);
  const [errors, setErrors] = useState<CreateInstrumentErrors>({});
  const [lastInitial, setLastInitial] = useState(initial);
  if (initial !== lastInitial) {
    setLastInitial(initial);
    setDraft(initial);
    setErrors({});
  }

  const set = (field: keyof Draft, value: string) => {
    setDraft((current) => ({ ...current, [field]: value }));
    setErrors((current) => ({ ...current, [field]: undefined }));
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const request = toRequest(draft);
    const found = validateCreateInstrument(request);
    setErrors(found);
    if (Object.keys(found).length === 0) onSubmit(request);
  };

  const messages = error instanceof ApiError ? error.messages : error ? ['The instrument could not be saved. Try again.'] : [];

  return (
    <Dialog open={open} onClose={busy ? undefined : onClose} aria-labelledby={titleId}>
      <form noValidate onSubmit={submit}>
        <DialogTitle id={titleId}>{title}</DialogTitle>
        <DialogContent>
          <FormErrors messages={messages} />
          <Stack spacing={2} sx={{ pt: 1 }}>
            {owners && (
              <TextField
                select
                label="Owner"
                required
                value={draft.organizationId}
                onChange={(e) => set('organizationId', e.target.value)}
                error={Boolean(errors.organizationId)}
                helperText={errors.organizationId ?? 'The customer (or the lab itself) the instrument belongs to'}
              >
                {owners.map((o) => (
                  <MenuItem key={o.value} value={o.value}>
                    {o.label}
                  </MenuItem>
                ))}
              </TextField>
            )}
            <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
              <TextField
                label="Make"
                required
                autoFocus
                value={draft.make}
                onChange={(e) => set('make', e.target.value)}
                error={Boolean(errors.make)}
                helperText={errors.make}
              />
              <TextField
                label="Model"
                required
                value={draft.model}
                onChange={(e) => set('model', e.target.value)}
                error={Boolean(errors.model)}
                helperText={errors.model}
              />
              <TextField
                label="Serial number"
                required
                value={draft.serial}
                onChange={(e) => set('serial', e.target.value)}
                error={Boolean(errors.serial)}
                helperText={errors.serial}
              />
              <TextField label="Asset tag" value={draft.assetTag} onChange={(e) => set('assetTag', e.target.value)} />
              <TextField
                label="Recall interval (months)"
                value={draft.recallIntervalMonths}
                onChange={(e) => set('recallIntervalMonths', e.target.value)}
                error={Boolean(errors.recallIntervalMonths)}
                helperText={errors.recallIntervalMonths}
                slotProps={{ htmlInput: { inputMode: 'numeric' } }}
              />
              <TextField
                label="Next due"
                type="date"
                value={draft.nextDueDate}
                onChange={(e) => set('nextDueDate', e.target.value)}
                slotProps={{ inputLabel: { shrink: true } }}
              />
            </Box>
            <TextField
              label="Description"
              multiline
              minRows={2}
              value={draft.description}
              onChange={(e) => set('description', e.target.value)}
            />
          </Stack>
        </DialogContent>
        <DialogActions>
          <Button onClick={onClose} disabled={busy}>
            Cancel
          </Button>
          <Button type="submit" variant="contained" disabled={busy}>
            {busy ? 'Saving…' : submitLabel}
          </Button>
        </DialogActions>
      </form>
    </Dialog>
  );
}

/** "New instrument": the owner, identification and recall; ranges are added on the instrument's page. */
export function CreateInstrument({ owners }: { owners: readonly FilterOption[] }) {
  const [open, setOpen] = useState(false);
  const navigate = useNavigate();
  const create = useCreateInstrument({
    onSuccess: (instrument) => {
      notify('success', `${instrument.make} ${instrument.model} recorded. Add its ranges next.`);
      setOpen(false);
      navigate(instrumentPath(instrument.id));
    },
  });
  return (
    <>
      <Button
        variant="contained"
        startIcon={<AddIcon />}
        onClick={() => {
          create.reset();
          setOpen(true);
        }}
      >
        New instrument
      </Button>
      <InstrumentFormDialog
        open={open}
        title="New instrument"
        initial={EMPTY}
        owners={owners}
        busy={create.isPending}
        error={create.error}
        submitLabel="Create instrument"
        onClose={() => setOpen(false)}
        onSubmit={(request) => create.mutate(request)}
      />
    </>
  );
}

export function EditInstrument({ instrument }: { instrument: Instrument }) {
  const [open, setOpen] = useState(false);
  const [initial, setInitial] = useState(() => fromInstrument(instrument));
  const update = useUpdateInstrument({
    onSuccess: () => {
      notify('success', 'Instrument saved.');
      setOpen(false);
    },
  });
  return (
    <>
      <Button
        startIcon={<EditOutlined />}
        onClick={() => {
          update.reset();
          setInitial(fromInstrument(instrument));
          setOpen(true);
        }}
      >
        Edit
      </Button>
      <InstrumentFormDialog
        open={open}
        title={`Edit ${instrument.make} ${instrument.model}`}
        initial={initial}
        busy={update.isPending}
        error={update.error}
        submitLabel="Save"
        onClose={() => setOpen(false)}
        onSubmit={({ organizationId: _owner, ...changes }) => update.mutate({ id: instrument.id, changes })}
      />
    </>
  );
}
