import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { Controller } from 'react-hook-form';
import { CAPTURE_DEFAULTS, DECISION_RULES, type DecisionRule, type Procedure } from '@kilocycle/common/types';
import { FormDialog, FormSelectField, FormSwitch, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { notify } from '@/lib/notifications';
import { procedureSchema, useSaveProcedure } from '../api/save-procedure';
import { DECISION_RULE_LABELS } from '../utils/results-format';
import { ExtraComponentsEditor, toDrafts } from './extra-components-editor';

function toDraft(p: Procedure | null) {
  return {
    name: p?.name ?? '',
    method: p?.method ?? '',
    decisionRule: p?.decisionRule ?? ('simple' as DecisionRule),
    dialHalfDivisionPercentOfSpan: p ? String(p.dialHalfDivisionPercentOfSpan) : '0.25',
    driftPpm: p ? String(p.driftPpm) : '1',
    driftHz: p ? String(p.driftHz) : '0',
    extraComponents: toDrafts(p?.extraComponents ?? []),
    isDefault: p?.isDefault ?? false,
    active: p?.active ?? true,
    captureSettleCount: String(p?.captureSettleCount ?? CAPTURE_DEFAULTS.captureSettleCount),
    captureToleranceHz: String(p?.captureToleranceHz ?? CAPTURE_DEFAULTS.captureToleranceHz),
    captureTimeoutS: String(p?.captureTimeoutS ?? CAPTURE_DEFAULTS.captureTimeoutS),
    dialMarks: (p?.dialMarks ?? []).join(', '),
  };
}

type ProcedureDialogProps = { procedure: Procedure | null; canEdit: boolean; onClose: () => void };

export function ProcedureDialog({ procedure, canEdit, onClose }: ProcedureDialogProps) {
  const form = useZodForm(procedureSchema, toDraft(procedure));
  const save = useSaveProcedure({
    onSuccess: (saved) => {
      notify('success', `Procedure “${saved.name}” saved.`);
      onClose();
    },
  });
  const disabled = !canEdit || save.isPending;
  const { control } = form;

  return (
    <FormDialog
      open
      title={procedure ? `${procedure.name} (version ${procedure.version})` : 'New procedure'}
      intro={
        procedure &&
        canEdit &&
        `Saving a change makes version ${procedure.version + 1}. Open jobs use it at once; signed jobs keep the version they were signed with.`
      }
      form={form}
      onSubmit={({ active, ...body }) =>
        procedure ? save.mutate({ id: procedure.id, changes: { ...body, active } }) : save.mutate({ id: null, changes: body })
      }
      onClose={onClose}
      pending={save.isPending}
      error={save.error}
      errorFallback="The procedure could not be saved."
      submitLabel="Save procedure"
      pendingLabel="Saving…"
      readOnly={!canEdit}
      maxWidth="md"
      layout="custom"
    >
      <Box sx={{ display: 'grid', gap: 2, pt: 1 }}>
        <FormTextField control={control} name="name" label="Name" required disabled={disabled} />
        <FormTextField
          control={control}
          name="method"
          label="Method"
          required
          multiline
          minRows={3}
          helperText="Printed on the certificate as the identification of the method"
          disabled={disabled}
        />
        <FormSelectField
          control={control}
          name="decisionRule"
          label="Decision rule"
          options={DECISION_RULES.map((rule) => ({ value: rule, label: DECISION_RULE_LABELS[rule] }))}
          disabled={disabled}
        />
        <Typography variant="h4" component="h3">
          Budget defaults
        </Typography>
        <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: 'repeat(3, 1fr)' }, gap: 2 }}>
          <FormTextField
            control={control}
            name="dialHalfDivisionPercentOfSpan"
            label="Half a dial division (% of span)"
            inputMode="decimal"
            disabled={disabled}
          />
          <FormTextField control={control} name="driftPpm" label="Drift allowance (± ppm)" inputMode="decimal" disabled={disabled} />
          <FormTextField control={control} name="driftHz" label="Drift allowance (± Hz)" inputMode="decimal" disabled={disabled} />
        </Box>
        <Typography variant="body2" color="text.secondary">
          The standard’s time base, its calibration, the counter’s ±1 count and the repeatability come from the run and the standard; these figures and the
          extra components below are added to them.
        </Typography>
        <Controller
          control={control}
          name="extraComponents"
          render={({ field, fieldState }) => (
            <ExtraComponentsEditor value={field.value} onChange={field.onChange} disabled={disabled} error={fieldState.error?.message} />
          )}
        />
        <Typography variant="h4" component="h3">
          Counter-assisted capture
        </Typography>
        <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: 'repeat(3, 1fr)' }, gap: 2 }}>
          <FormTextField control={control} name="captureSettleCount" label="Readings that must agree (N)" inputMode="numeric" disabled={disabled} />
          <FormTextField control={control} name="captureToleranceHz" label="Settle band (Hz)" inputMode="decimal" disabled={disabled} />
          <FormTextField control={control} name="captureTimeoutS" label="Timeout (s)" inputMode="numeric" disabled={disabled} />
        </Box>
        <FormTextField
          control={control}
          name="dialMarks"
          label="Dial marks, in order"
          helperText="Proposed one after another on the capture form, e.g. 1750, 1800, 1850; leave empty for none"
          disabled={disabled}
        />
        <Typography variant="body2" color="text.secondary">
          With a bridge live, the technician types only the dial: the setting is stored once the last N counter readings lie within the band, as their mean,
          with their spread feeding the repeatability.
        </Typography>
        <Box sx={{ display: 'flex', gap: 3 }}>
          <FormSwitch control={control} name="isDefault" label="Default for new jobs" disabled={disabled} />
          {procedure && <FormSwitch control={control} name="active" label="Active" disabled={disabled} />}
        </Box>
      </Box>
    </FormDialog>
  );
}
