import AddBusinessOutlined from '@mui/icons-material/AddBusinessOutlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { FormDialog, FormRadioGroup, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { notify } from '@/lib/notifications';
import { createOrganizationSchema, useCreateOrganization } from '../api/create-organization';

const KINDS = [
  { value: 'customer', label: 'Customer' },
  { value: 'lab', label: 'Lab' },
];

export function CreateOrganization() {
  const [open, setOpen] = useState(false);
  const form = useZodForm(createOrganizationSchema, { name: '', kind: 'customer', contactEmail: '' });
  const create = useCreateOrganization({
    onSuccess: (organization) => {
      notify('success', `${organization.name} added.`);
      setOpen(false);
    },
  });

  return (
    <>
      <Button variant="contained" startIcon={<AddBusinessOutlined />} onClick={() => setOpen(true)}>
        New organisation
      </Button>
      <FormDialog
        open={open}
        title="New organisation"
        form={form}
        onSubmit={(request) => create.mutate(request)}
        onClose={() => setOpen(false)}
        onExited={() => create.reset()}
        pending={create.isPending}
        error={create.error}
        errorFallback="The organisation could not be created. Try again."
        submitLabel="Add organisation"
        pendingLabel="Adding…"
      >
        <FormTextField control={form.control} name="name" label="Name" required />
        <FormRadioGroup control={form.control} name="kind" label="Kind" options={KINDS} />
        <FormTextField
          control={form.control}
          name="contactEmail"
          label="Contact e-mail"
          type="email"
          helperText="Optional. Where certificates and notices are sent."
        />
      </FormDialog>
    </>
  );
}
