import EditNoteOutlined from '@mui/icons-material/EditNoteOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import InputAdornment from '@mui/material/InputAdornment';
import { useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { CALIBRATION_RUN_KINDS, type Role, type Run } from '@kilocycle/common/types';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { useStandards } from '@/lib/get-standards';
import { formatDate } from '@/utils/format';
import { getRunCorrectionsQueryOptions } from '../api/get-run-corrections';
import { correctRunSchema, useUpdateRun } from '../api/update-run';

const draftOf = (run: Run) => ({
  standardId: run.standardId === null ? '' : String(run.standardId),
  supplyVoltage: run.supplyVoltage === null ? '' : String(run.supplyVoltage),
  configuration: run.configuration ?? '',
  notes: run.notes ?? '',
  reason: '',
  overrideReason: '',
});

/**
 * "Correct run details": the standard, supply voltage, configuration and notes of a run whose job is
 * still open, each correction with a reason that goes into the audit trail with the old and new values.
 */
export function CorrectRunDialog({ run, role }: { run: Run; role: Role }) {
  const queryClient = useQueryClient();
  const [open, setOpen] = useState(false);
  const standards = useStandards({ query: { active: true, pageSize: 200, sort: 'name' }, enabled: open });
  const update = useUpdateRun({
    onSuccess: () => {
      setOpen(false);
      void queryClient.invalidateQueries({ queryKey: getRunCorrectionsQueryOptions(run.id).queryKey });
    },
  });
  const needsStandard = CALIBRATION_RUN_KINDS.includes(run.kind);
  const choices = standards.data?.items ?? [];
  const isOverdue = (id: number | null) => Boolean(choices.find((s) => s.id === id)?.overdue);
  const form = useZodForm(correctRunSchema(run, { needsStandard, asksOverride: (id) => role === 'lead' && isOverdue(id) }), draftOf(run));
  const standardId = form.watch('standardId');
  const standardChanged = standardId !== (run.standardId === null ? '' : String(run.standardId));
  const lapsed = standardChanged && isOverdue(standardId === '' ? null : Number(standardId));
  const askOverride = lapsed && role === 'lead';

  const options = [
    ...(needsStandard ? [] : [{ value: '', label: 'None' }]),
    ...choices.map((s) => ({ value: String(s.id), label: `${s.name} (due ${formatDate(s.dueDate)})${s.overdue ? ' — calibration overdue' : ''}` })),
  ];
  return (
    <>
      <Button
        variant="outlined"
        startIcon={<EditNoteOutlined />}
        onClick={() => {
          update.reset();
          form.reset(draftOf(run));
          setOpen(true);
        }}
      >
        Correct run details
      </Button>
      <FormDialog
        open={open}
        title="Correct run details"
        intro="For details recorded wrongly when the run was opened. The readings stay as they are; the correction, its reason and the values before and after are kept in the audit trail with your name."
        form={form}
        onSubmit={(changes) => update.mutate({ id: run.id, changes })}
        onClose={() => setOpen(false)}
        pending={update.isPending}
        error={update.error}
        errorFallback="The correction could not be saved."
        submitLabel="Save correction"
        pendingLabel="Saving…"
      >
        <FormSelectField
          control={form.control}
          name="standardId"
          label="Reference standard"
          required={needsStandard}
          // Until the list has come, a chosen standard has no option to show.
          options={choices.length === 0 && standardId ? [{ value: standardId, label: 'Loading…', disabled: true }] : options}
          helperText={needsStandard ? 'As-found and as-left results are stated against it' : 'The counter or reference measured against'}
        />
        {lapsed && role !== 'lead' && <Alert severity="warning">This standard is past its due date: only a lead can use it, with a written reason.</Alert>}
        {askOverride && <FormTextField control={form.control} name="overrideReason" label="Why the lapsed standard is used" required multiline minRows={2} />}
        <FormTextField
          control={form.control}
          name="supplyVoltage"
          label="Supply voltage"
          slotProps={{ input: { endAdornment: <InputAdornment position="end">V</InputAdornment> }, htmlInput: { inputMode: 'decimal' } }}
        />
        <FormTextField control={form.control} name="configuration" label="Configuration" />
        <FormTextField control={form.control} name="notes" label="Notes" multiline minRows={2} />
        <FormTextField
          control={form.control}
          name="reason"
          label="Reason for the correction"
          required
          helperText="Kept in the audit trail, e.g. “Counter A was used; the run was opened without it”"
        />
      </FormDialog>
    </>
  );
}
