import AddBusinessOutlined from '@mui/icons-material/AddBusinessOutlined';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import FormControl from '@mui/material/FormControl';
import FormControlLabel from '@mui/material/FormControlLabel';
import FormLabel from '@mui/material/FormLabel';
import Radio from '@mui/material/Radio';
import RadioGroup from '@mui/material/RadioGroup';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import { useId, useState, type FormEvent } from 'react';
import type { CreateOrganizationRequest, OrganizationKind } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import {
  useCreateOrganization,
  validateCreateOrganization,
  type CreateOrganizationErrors,
} from '../api/create-organization';

type Draft = { name: string; kind: OrganizationKind; contactEmail: string };

const EMPTY: Draft = { name: '', kind: 'customer', contactEmail: '' };

function serverMessages(error: unknown) {
  if (error instanceof ApiError) return error.messages;
  return error ? ['The organisation could not be created. Try again.'] : [];
}

export function CreateOrganization() {
  const titleId = useId();
  const kindLabelId = useId();
  const [open, setOpen] = useState(false);
  const [draft, setDraft] = useState<Draft>(EMPTY);
  const [errors, setErrors] = useState<CreateOrganizationErrors>({});
  const create = useCreateOrganization({
    onSuccess: (organization) => {
      notify('success', `${organization.name} added.`);
      close();
    },
  });

  function close() {
    setOpen(false);
    setDraft(EMPTY);
    setErrors({});
    create.reset();
  }

  const set = <K extends keyof Draft>(field: K, value: Draft[K]) => {
    setDraft((current) => ({ ...current, [field]: value }));
    setErrors((current) => ({ ...current, [field]: undefined }));
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const contactEmail = draft.contactEmail.trim();
    const request: CreateOrganizationRequest = {
      name: draft.name.trim(),
      kind: draft.kind,
      ...(contactEmail ? { contactEmail } : {}),
    };
    const found = validateCreateOrganization(request);
    setErrors(found);
    if (Object.keys(found).length === 0) create.mutate(request);
  };

  return (
    <>
      <Button variant="contained" startIcon={<AddBusinessOutlined />} onClick={() => setOpen(true)}>
        New organisation
      </Button>
      <Dialog open={open} onClose={create.isPending ? undefined : close} aria-labelledby={titleId}>
        <form noValidate onSubmit={submit}>
          <DialogTitle id={titleId}>New organisation</DialogTitle>
          <DialogContent>
            <FormErrors messages={serverMessages(create.error)} />
            <Stack spacing={2} sx={{ pt: 1 }}>
              <TextField
                label="Name"
                required
                autoFocus
                value={draft.name}
                onChange={(e) => set('name', e.target.value)}
                error={Boolean(errors.name)}
                helperText={errors.name}
              />
              <FormControl>
                <FormLabel id={kindLabelId}>Kind</FormLabel>
                <RadioGroup
                  row
                  aria-labelledby={kindLabelId}
                  value={draft.kind}
                  onChange={(e) => set('kind', e.target.value as OrganizationKind)}
                >
                  <FormControlLabel value="customer" control={<Radio size="small" />} label="Customer" />
                  <FormControlLabel value="lab" control={<Radio size="small" />} label="Lab" />
                </RadioGroup>
              </FormControl>
              <TextField
                label="Contact e-mail"
                type="email"
                value={draft.contactEmail}
                onChange={(e) => set('contactEmail', e.target.value)}
                error={Boolean(errors.contactEmail)}
                helperText={errors.contactEmail ?? 'Optional. Where certificates and notices are sent.'}
              />
            </Stack>
          </DialogContent>
          <DialogActions>
            <Button onClick={close} disabled={create.isPending}>
              Cancel
            </Button>
            <Button type="submit" variant="contained" disabled={create.isPending}>
              {create.isPending ? 'Adding…' : 'Add organisation'}
            </Button>
          </DialogActions>
        </form>
      </Dialog>
    </>
  );
}
