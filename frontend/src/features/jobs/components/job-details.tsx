import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import InputAdornment from '@mui/material/InputAdornment';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { useState, type ReactNode } from 'react';
import { LOCKED_JOB_STATUSES } from '@kilocycle/common/rules';
import type { Job } from '@kilocycle/common/types';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { Num } from '@/components/ui/num';
import type { FilterOption } from '@/components/ui/select-filter';
import { formatDate } from '@/utils/format';
import { updateJobSchema, useUpdateJob } from '../api/update-job';

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
  const current = {
    receivedDate: job.receivedDate.slice(0, 10),
    conditionReceived: job.conditionReceived ?? '',
    technicianId: job.technicianId ? String(job.technicianId) : '',
    ambientTempC: job.ambientTempC === null ? '' : String(job.ambientTempC),
    humidityPct: job.humidityPct === null ? '' : String(job.humidityPct),
    notes: job.notes ?? '',
  };
  const form = useZodForm(updateJobSchema, current, current);
  const update = useUpdateJob({ onSuccess: onClose });
  const unit = (text: string) => ({ input: { endAdornment: <InputAdornment position="end">{text}</InputAdornment> } });
  return (
    <FormDialog
      open={open}
      title={`Job ${job.number}`}
      form={form}
      onSubmit={(changes) => update.mutate({ id: job.id, changes })}
      onClose={onClose}
      onExited={() => update.reset()}
      pending={update.isPending}
      error={update.error}
      errorFallback="The job could not be saved."
      submitLabel="Save"
      pendingLabel="Saving…"
    >
      <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
        <FormTextField control={form.control} name="receivedDate" label="Received" type="date" slotProps={{ inputLabel: { shrink: true } }} />
        <FormSelectField
          control={form.control}
          name="technicianId"
          label="Technician"
          options={[{ value: '', label: 'Not assigned' }, ...technicians.map((t) => ({ value: String(t.value), label: t.label }))]}
        />
        <FormTextField control={form.control} name="ambientTempC" label="Temperature" slotProps={unit('°C')} />
        <FormTextField control={form.control} name="humidityPct" label="Relative humidity" slotProps={unit('%')} />
      </Box>
      <FormTextField control={form.control} name="conditionReceived" label="Condition as received" multiline minRows={2} />
      <FormTextField control={form.control} name="notes" label="Notes" multiline />
    </FormDialog>
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
