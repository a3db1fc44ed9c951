import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import InputAdornment from '@mui/material/InputAdornment';
import MenuItem from '@mui/material/MenuItem';
import Paper from '@mui/material/Paper';
import Stack from '@mui/material/Stack';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useId, useState, type ReactNode } from 'react';
import { LOCKED_JOB_STATUSES } from '@kilocycle/common/rules';
import type { Job, UpdateJobRequest } from '@kilocycle/common/types';
import { FormErrors } from '@/components/ui/form-errors';
import { Num } from '@/components/ui/num';
import type { FilterOption } from '@/components/ui/select-filter';
import { ApiError } from '@/lib/api-client';
import { formatDate } from '@/utils/format';
import { useUpdateJob } from '../api/update-job';

function Field({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Box>
      <Typography variant="caption" color="text.secondary" component="div">
        {label}
      </Typography>
      <Typography variant="body2" component="div" sx={{ whiteSpace: 'pre-wrap' }}>
        {children}
      </Typography>
    </Box>
  );
}

type EditProps = { job: Job; technicians: readonly FilterOption[]; open: boolean; onClose: () => void };

function EditJobDialog({ job, technicians, open, onClose }: EditProps) {
  const titleId = useId();
  const initial = () => ({
    receivedDate: job.receivedDate.slice(0, 10),
    conditionReceived: job.conditionReceived ?? '',
    technicianId: job.technicianId ? String(job.technicianId) : '',
    ambientTempC: job.ambientTempC === null ? '' : String(job.ambientTempC),
    humidityPct: job.humidityPct === null ? '' : String(job.humidityPct),
    notes: job.notes ?? '',
  });
  const [draft, setDraft] = useState(initial);
  const [wasOpen, setWasOpen] = useState(open);
  if (open !== wasOpen) {
    setWasOpen(open);
    if (open) setDraft(initial());
  }
  const update = useUpdateJob({ onSuccess: onClose });
  const num = (text: string) => (text.trim() === '' ? null : Number(text.replace(',', '.')));
  const save = () => {
    const changes: UpdateJobRequest = {
      receivedDate: draft.receivedDate,
      conditionReceived: draft.conditionReceived.trim() || null,
      technicianId: draft.technicianId ? Number(draft.technicianId) : null,
      ambientTempC: num(draft.ambientTempC),
      humidityPct: num(draft.humidityPct),
      notes: draft.notes.trim() || null,
    };
    update.mutate({ id: job.id, changes });
  };
  const set = (field: keyof ReturnType<typeof initial>, value: string) => setDraft((d) => ({ ...d, [field]: value }));
  return (
    <Dialog open={open} onClose={update.isPending ? undefined : onClose} aria-labelledby={titleId} slotProps={{ transition: { onExited: () => update.reset() } }}>
      <DialogTitle id={titleId}>Job {job.number}</DialogTitle>
      <DialogContent>
        <FormErrors messages={update.error instanceof ApiError ? update.error.messages : update.error ? ['The job could not be saved.'] : []} />
        <Stack spacing={2} sx={{ pt: 1 }}>
          <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
            <TextField label="Received" type="date" value={draft.receivedDate} onChange={(e) => set('receivedDate', e.target.value)} slotProps={{ inputLabel: { shrink: true } }} />
            <TextField select label="Technician" value={draft.technicianId} onChange={(e) => set('technicianId', e.target.value)}>
              <MenuItem value="">Not assigned</MenuItem>
              {technicians.map((t) => (
                <MenuItem key={t.value} value={t.value}>
                  {t.label}
                </MenuItem>
              ))}
            </TextField>
            <TextField
              label="Temperature"
              value={draft.ambientTempC}
              onChange={(e) => set('ambientTempC', e.target.value)}
              slotProps={{ input: { endAdornment: <InputAdornment position="end">°C</InputAdornment> } }}
            />
            <TextField
              label="Relative humidity"
              value={draft.humidityPct}
              onChange={(e) => set('humidityPct', e.target.value)}
              slotProps={{ input: { endAdornment: <InputAdornment position="end">%</InputAdornment> } }}
            />
          </Box>
          <TextField label="Condition as received" multiline minRows={2} value={draft.conditionReceived} onChange={(e) => set('conditionReceived', e.target.value)} />
          <TextField label="Notes" multiline value={draft.notes} onChange={(e) => set('notes', e.target.value)} />
        </Stack>
      </DialogContent>
      <DialogActions>
        <Button onClick={onClose} disabled={update.isPending}>
          Cancel
        </Button>
        <Button variant="contained" onClick={save} disabled={update.isPending}>
          {update.isPending ? 'Saving…' : 'Save'}
        </Button>
      </DialogActions>
    </Dialog>
  );
}

type JobDetailsProps = {
  job: Job;
  /** A link to the instrument's page, composed by the route. */
  instrumentLink: ReactNode;
  canEdit: boolean;
  technicians?: readonly FilterOption[];
};

/** The job's customer, instrument, condition as received and environment. */
export function JobDetails({ job, instrumentLink, canEdit, technicians = [] }: JobDetailsProps) {
  const [editing, setEditing] = useState(false);
  const locked = LOCKED_JOB_STATUSES.includes(job.status);
  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', mb: 1 }}>
        <Typography variant="h3" component="h2" sx={{ flex: 1 }}>
          Job
        </Typography>
        {canEdit && !locked && (
          <Button size="small" startIcon={<EditOutlined />} onClick={() => setEditing(true)}>
            Edit
          </Button>
        )}
      </Box>
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr 1fr', md: 'repeat(3, 1fr)' }, gap: 2 }}>
        <Field label="Instrument">{instrumentLink}</Field>
        <Field label="Customer">{job.organizationName}</Field>
        <Field label="Received">
          <Num>{formatDate(job.receivedDate)}</Num>
        </Field>
        <Field label="Technician">{job.technicianName ?? 'Not assigned'}</Field>
        <Field label="Environment">
          <Num>{job.ambientTempC === null ? '—' : `${job.ambientTempC.toFixed(1)} °C`}</Num>
          {' · '}
          <Num>{job.humidityPct === null ? '—' : `${job.humidityPct.toFixed(0)} % RH`}</Num>
        </Field>
        <Field label="Last change">
          <Num>{formatDate(job.updatedAt)}</Num>
        </Field>
      </Box>
      <Box sx={{ mt: 2, display: 'grid', gap: 1 }}>
        <Field label="Condition as received">{job.conditionReceived ?? '—'}</Field>
        {job.notes && <Field label="Notes">{job.notes}</Field>}
      </Box>
      {canEdit && <EditJobDialog job={job} technicians={technicians} open={editing} onClose={() => setEditing(false)} />}
    </Paper>
  );
}
