import PersonAddAlt1Outlined from '@mui/icons-material/PersonAddAlt1Outlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { LAB_ROLES, MAX_PASSWORD_BYTES, MIN_PASSWORD_LENGTH, ROLES, type Organization, type Role } from '@kilocycle/common/types';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { ROLE_LABELS } from '@/config/roles';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { createUserSchema, useCreateUser } from '../api/create-user';

// Lab staff belong to the lab; a client belongs to one customer organisation.
function organisationsFor(role: Role, organizations: readonly Organization[]) {
  const kind = LAB_ROLES.includes(role) ? 'lab' : 'customer';
  return organizations.filter((o) => o.active && o.kind === kind);
}

// The server's password refusals ("password is too easy to guess: …", "… at most 72 bytes …") go under the field.
const isPasswordMessage = (message: string) => message.startsWith('password ');

function serverPasswordMessage(error: unknown): string | undefined {
  if (!(error instanceof ApiError)) return undefined;
  const found = error.messages.find(isPasswordMessage);
  return found && `${found.charAt(0).toUpperCase()}${found.slice(1)}`;
}

const ROLE_OPTIONS = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));

type CreateUserProps = { organizations: readonly Organization[]; organizationsLoading?: boolean };

export function CreateUser({ organizations, organizationsLoading }: CreateUserProps) {
  const [open, setOpen] = useState(false);
  const form = useZodForm(createUserSchema, { email: '', name: '', role: 'technician', organizationId: '', password: '' });
  const createUser = useCreateUser({
    onSuccess: (user) => {
      notify('success', `Account created for ${user.name}.`);
      setOpen(false);
    },
  });

  const [role, password] = form.watch(['role', 'password']);
  const choices = organisationsFor(role, organizations);
  // The refusal is about the password that was sent; a new one answers it.
  const passwordRefusal = password === createUser.variables?.password ? serverPasswordMessage(createUser.error) : undefined;

  // Changing between lab and client roles invalidates the organisation chosen for the other kind.
  const roleChanged = (next: string) => {
    const chosen = form.getValues('organizationId');
    if (chosen && !organisationsFor(next as Role, organizations).some((o) => String(o.id) === chosen)) form.setValue('organizationId', '');
  };

  const organisationOptions =
    choices.length === 0
      ? [{ value: '', label: organizationsLoading ? 'Loading…' : 'No active organisation of this kind', disabled: true }]
      : choices.map((o) => ({ value: String(o.id), label: o.name }));

  return (
    <>
      <Button variant="contained" startIcon={<PersonAddAlt1Outlined />} onClick={() => setOpen(true)}>
        New user
      </Button>
      <FormDialog
        open={open}
        title="New user"
        form={form}
        onSubmit={(request) => createUser.mutate(request)}
        onClose={() => setOpen(false)}
        onExited={() => createUser.reset()}
        pending={createUser.isPending}
        error={createUser.error}
        errorFallback="The account could not be created. Try again."
        keepMessage={(message) => !isPasswordMessage(message)}
        submitLabel="Create user"
        pendingLabel="Creating…"
      >
        <FormTextField control={form.control} name="name" label="Name" required />
        <FormTextField control={form.control} name="email" label="E-mail" type="email" required autoComplete="off" />
        <FormSelectField control={form.control} name="role" label="Role" required options={ROLE_OPTIONS} onValueChange={roleChanged} />
        <FormSelectField
          control={form.control}
          name="organizationId"
          label="Organisation"
          required
          options={organisationOptions}
          helperText={role === 'client' ? 'The customer this person belongs to' : 'Lab staff belong to the lab'}
          disabled={organizationsLoading}
        />
        <FormTextField
          control={form.control}
          name="password"
          label="Initial password"
          type="password"
          required
          autoComplete="new-password"
          error={Boolean(passwordRefusal)}
          helperText={
            passwordRefusal ??
            `At least ${MIN_PASSWORD_LENGTH} characters, at most ${MAX_PASSWORD_BYTES} bytes; not a common password, the person’s name or e-mail. Pass it on privately.`
          }
        />
      </FormDialog>
    </>
  );
}
