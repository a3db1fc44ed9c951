import PersonAddAlt1Outlined from '@mui/icons-material/PersonAddAlt1Outlined';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import { useId, useState, type FormEvent } from 'react';
import {
  LAB_ROLES,
  MAX_PASSWORD_BYTES,
  MIN_PASSWORD_LENGTH,
  ROLES,
  type CreateUserRequest,
  type Organization,
  type Role,
} from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import { ROLE_LABELS } from '@/config/roles';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { useCreateUser, validateCreateUser, type CreateUserErrors } from '../api/create-user';

type Draft = Omit<CreateUserRequest, 'organizationId'> & { organizationId: number | '' };

const EMPTY: Draft = { email: '', name: '', role: 'technician', organizationId: '', password: '' };

// Lab staff belong to the lab; a client belongs to one customer organisation.
function organisationsFor(role: Role, organizations: readonly Organization[]) {
  const kind = LAB_ROLES.includes(role) ? 'lab' : 'customer';
  return organizations.filter((o) => o.active && o.kind === kind);
}

function serverMessages(error: unknown) {
  if (error instanceof ApiError) return error.messages.filter((m) => !isPasswordMessage(m));
  return error ? ['The account could not be created. Try again.'] : [];
}

// The server's password refusals ("password is too easy to guess: …", "… at most 72 bytes …") go under the field.
const isPasswordMessage = (message: string) => message.startsWith('password ');

function serverPasswordMessage(error: unknown): string | undefined {
  if (!(error instanceof ApiError)) return undefined;
  const found = error.messages.find(isPasswordMessage);
  return found && `${found.charAt(0).toUpperCase()}${found.slice(1)}`;
}

type CreateUserProps = { organizations: readonly Organization[]; organizationsLoading?: boolean };

export function CreateUser({ organizations, organizationsLoading }: CreateUserProps) {
  const titleId = useId();
  const [open, setOpen] = useState(false);
  const [draft, setDraft] = useState<Draft>(EMPTY);
  const [errors, setErrors] = useState<CreateUserErrors>({});
  const createUser = useCreateUser({
    onSuccess: (user) => {
      notify('success', `Account created for ${user.name}.`);
      close();
    },
  });

  const choices = organisationsFor(draft.role, organizations);
  const passwordRefusal = serverPasswordMessage(createUser.error);

  function close() {
    setOpen(false);
    setDraft(EMPTY);
    setErrors({});
    createUser.reset();
  }

  const set = <K extends keyof Draft>(field: K, value: Draft[K]) => {
    setDraft((current) => {
      const next = { ...current, [field]: value };
      // Changing between lab and client roles invalidates the organisation chosen for the other kind.
      if (field === 'role' && next.organizationId !== '') {
        const stillValid = organisationsFor(next.role, organizations).some((o) => o.id === next.organizationId);
        if (!stillValid) next.organizationId = '';
      }
      return next;
    });
    setErrors((current) => ({ ...current, [field]: undefined }));
    // A new password answers the server's refusal of the old one.
    if (field === 'password' && createUser.error) createUser.reset();
  };

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const request: CreateUserRequest = {
      email: draft.email.trim(),
      name: draft.name.trim(),
      role: draft.role,
      organizationId: draft.organizationId === '' ? 0 : draft.organizationId,
      password: draft.password,
    };
    const found = validateCreateUser(request);
    setErrors(found);
    if (Object.keys(found).length === 0) createUser.mutate(request);
  };

  return (
    <>
      <Button variant="contained" startIcon={<PersonAddAlt1Outlined />} onClick={() => setOpen(true)}>
        New user
      </Button>
      <Dialog open={open} onClose={createUser.isPending ? undefined : close} aria-labelledby={titleId}>
        <form noValidate onSubmit={submit}>
          <DialogTitle id={titleId}>New user</DialogTitle>
          <DialogContent>
            <FormErrors messages={serverMessages(createUser.error)} />
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
              <TextField
                label="E-mail"
                type="email"
                required
                autoComplete="off"
                value={draft.email}
                onChange={(e) => set('email', e.target.value)}
                error={Boolean(errors.email)}
                helperText={errors.email}
              />
              <TextField
                select
                label="Role"
                required
                value={draft.role}
                onChange={(e) => set('role', e.target.value as Role)}
              >
                {ROLES.map((role) => (
                  <MenuItem key={role} value={role}>
                    {ROLE_LABELS[role]}
                  </MenuItem>
                ))}
              </TextField>
              <TextField
                select
                label="Organisation"
                required
                value={draft.organizationId === '' ? '' : String(draft.organizationId)}
                onChange={(e) => set('organizationId', e.target.value === '' ? '' : Number(e.target.value))}
                error={Boolean(errors.organizationId)}
                helperText={
                  errors.organizationId ??
                  (draft.role === 'client' ? 'The customer this person belongs to' : 'Lab staff belong to the lab')
                }
                disabled={organizationsLoading}
              >
                {choices.length === 0 && (
                  <MenuItem value="" disabled>
                    {organizationsLoading ? 'Loading…' : 'No active organisation of this kind'}
                  </MenuItem>
                )}
                {choices.map((o) => (
                  <MenuItem key={o.id} value={String(o.id)}>
                    {o.name}
                  </MenuItem>
                ))}
              </TextField>
              <TextField
                label="Initial password"
                type="password"
                required
                autoComplete="new-password"
                value={draft.password}
                onChange={(e) => set('password', e.target.value)}
                error={Boolean(errors.password ?? passwordRefusal)}
                helperText={
                  errors.password ??
                  passwordRefusal ??
                  `At least ${MIN_PASSWORD_LENGTH} characters, at most ${MAX_PASSWORD_BYTES} bytes; not a common password, the person’s name or e-mail. Pass it on privately.`
                }
              />
            </Stack>
          </DialogContent>
          <DialogActions>
            <Button onClick={close} disabled={createUser.isPending}>
              Cancel
            </Button>
            <Button type="submit" variant="contained" disabled={createUser.isPending}>
              {createUser.isPending ? 'Creating…' : 'Create user'}
            </Button>
          </DialogActions>
        </form>
      </Dialog>
    </>
  );
}
