import AddIcon from '@mui/icons-material/Add';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import type { FilterOption } from '@/components/ui/select-filter';
import { notify } from '@/lib/notifications';
import { createBenchSchema, useCreateBench } from '../api/create-bench';

type CreateBenchProps = { standards: readonly FilterOption[] };

/** "New bench": a measurement station with the standard it uses unless a run names another. */
export function CreateBench({ standards }: CreateBenchProps) {
  const [open, setOpen] = useState(false);
  const form = useZodForm(createBenchSchema, { name: '', location: '', defaultStandardId: '' });
  const create = useCreateBench({
    onSuccess: (bench) => {
      notify('success', `${bench.name} added. Issue it a bridge token to stream readings.`);
      setOpen(false);
    },
  });

  return (
    <>
      <Button variant="contained" startIcon={<AddIcon />} onClick={() => setOpen(true)}>
        New bench
      </Button>
      <FormDialog
        open={open}
        title="New bench"
        form={form}
        onSubmit={(request) => create.mutate(request)}
        onClose={() => setOpen(false)}
        onExited={() => create.reset()}
        pending={create.isPending}
        error={create.error}
        errorFallback="The bench could not be created."
        submitLabel="Create bench"
        pendingLabel="Creating…"
      >
        <FormTextField control={form.control} name="name" label="Name" required />
        <FormTextField control={form.control} name="location" label="Location" />
        <FormSelectField
          control={form.control}
          name="defaultStandardId"
          label="Default standard"
          helperText="Used by runs on this bench that name no other"
          options={[{ value: '', label: 'None' }, ...standards.map((s) => ({ value: String(s.value), label: s.label }))]}
        />
      </FormDialog>
    </>
  );
}
