import AddIcon from '@mui/icons-material/Add';
import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import type { CreateInstrumentRequest, Instrument } from '@kilocycle/common/types';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import type { FilterOption } from '@/components/ui/select-filter';
import { instrumentPath } from '@/config/paths';
import { notify } from '@/lib/notifications';
import { instrumentSchema, useCreateInstrument } from '../api/create-instrument';
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
  const form = useZodForm(instrumentSchema, initial, initial);
  return (
    <FormDialog
      open={open}
      title={title}
      form={form}
      onSubmit={onSubmit}
      onClose={onClose}
      pending={busy}
      error={error}
      errorFallback="The instrument could not be saved. Try again."
      submitLabel={submitLabel}
      pendingLabel="Saving…"
    >
      {owners && (
        <FormSelectField
          control={form.control}
          name="organizationId"
          label="Owner"
          required
          helperText="The customer (or the lab itself) the instrument belongs to"
          options={owners.map((o) => ({ value: String(o.value), label: o.label }))}
        />
      )}
      <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
        <FormTextField control={form.control} name="make" label="Make" required />
        <FormTextField control={form.control} name="model" label="Model" required />
        <FormTextField control={form.control} name="serial" label="Serial number" required />
        <FormTextField control={form.control} name="assetTag" label="Asset tag" />
        <FormTextField
          control={form.control}
          name="recallIntervalMonths"
          label="Recall interval (months)"
          slotProps={{ htmlInput: { inputMode: 'numeric' } }}
        />
        <FormTextField control={form.control} name="nextDueDate" label="Next due" type="date" slotProps={{ inputLabel: { shrink: true } }} />
      </Box>
      <FormTextField control={form.control} name="description" label="Description" multiline minRows={2} />
    </FormDialog>
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
