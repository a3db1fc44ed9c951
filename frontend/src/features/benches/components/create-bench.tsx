import AddIcon from '@mui/icons-material/Add';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import { useId, useState, type FormEvent } from 'react';
import { FormErrors } from '@/components/ui/form-errors';
import type { FilterOption } from '@/components/ui/select-filter';
import { ApiError } from '@/lib/api-client';
import { notify } from '@/lib/notifications';
import { useCreateBench } from '../api/create-bench';

type CreateBenchProps = { standards: readonly FilterOption[] };

/** "New bench": a measurement station with the standard it uses unless a run names another. */
export function CreateBench({ standards }: CreateBenchProps) {
  const titleId = useId();
  const [open, setOpen] = useState(false);
  const [name, setName] = useState('');
  const [location, setLocation] = useState('');
  const [standardId, setStandardId] = useState('');
  const [nameError, setNameError] = useState<string | undefined>();
  const create = useCreateBench({
    onSuccess: (bench) => {
      notify('success', `${bench.name} added. Issue it a bridge token to stream readings.`);
      close();
    },
  });

  function close() {
    setOpen(false);
    setName('');
    setLocation('');
    setStandardId('');
    setNameError(undefined);
    create.reset();
  }

  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    if (!name.trim()) {
      setNameError('Give the bench a name');
      return;
    }
    create.mutate({ name: name.trim(), location: location.trim() || null, defaultStandardId: standardId ? Number(standardId) : null });
  };

  const messages = create.error instanceof ApiError ? create.error.messages : create.error ? ['The bench could not be created.'] : [];

  return (
    <>
      <Button variant="contained" startIcon={<AddIcon />} onClick={() => setOpen(true)}>
        New bench
      </Button>
      <Dialog open={open} onClose={create.isPending ? undefined : close} aria-labelledby={titleId}>
        <form noValidate onSubmit={submit}>
          <DialogTitle id={titleId}>New bench</DialogTitle>
          <DialogContent>
            <FormErrors messages={messages} />
            <Stack spacing={2} sx={{ pt: 1 }}>
              <TextField
                label="Name"
                required
                autoFocus
                value={name}
                onChange={(e) => {
                  setName(e.target.value);
                  setNameError(undefined);
                }}
                error={Boolean(nameError)}
                helperText={nameError}
              />
              <TextField label="Location" value={location} onChange={(e) => setLocation(e.target.value)} />
              <TextField select label="Default standard" value={standardId} onChange={(e) => setStandardId(e.target.value)} helperText="Used by runs on this bench that name no other">
                <MenuItem value="">None</MenuItem>
                {standards.map((s) => (
                  <MenuItem key={s.value} value={s.value}>
                    {s.label}
                  </MenuItem>
                ))}
              </TextField>
            </Stack>
          </DialogContent>
          <DialogActions>
            <Button onClick={close} disabled={create.isPending}>
              Cancel
            </Button>
            <Button type="submit" variant="contained" disabled={create.isPending}>
              {create.isPending ? 'Creating…' : 'Create bench'}
            </Button>
          </DialogActions>
        </form>
      </Dialog>
    </>
  );
}
