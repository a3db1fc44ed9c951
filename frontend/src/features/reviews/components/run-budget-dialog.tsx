import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';
import Typography from '@mui/material/Typography';
import { Controller } from 'react-hook-form';
import type { RunBudget } from '@kilocycle/common/types';
import { FormDialog, FormSwitch, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { notify } from '@/lib/notifications';
import { formatDateTime } from '@/utils/format';
import { useRunBudget } from '../api/get-run-budget';
import { runBudgetSchema, useUpdateRunBudget } from '../api/update-run-budget';
import { ExtraComponentsEditor, toDrafts } from './extra-components-editor';

function toDraft(budget: RunBudget) {
  const text = (value: number | null) => (value === null ? '' : String(value));
  return {
    dialHalfDivision: text(budget.dialHalfDivision),
    driftPpm: text(budget.driftPpm),
    driftHz: text(budget.driftHz),
    counterResolutionHz: text(budget.counterResolutionHz),
    note: budget.note ?? '',
    overrideExtras: budget.extraComponents !== null,
    extras: toDrafts(budget.extraComponents ?? budget.effective.extraComponents),
  };
}

const EMPTY = { dialHalfDivision: '', driftPpm: '', driftHz: '', counterResolutionHz: '', note: '', overrideExtras: false, extras: [] };

type RunBudgetDialogProps = { runId: number; title: string; dialUnit: string; canEdit: boolean; onClose: () => void };

/** A run's budget figures: each left empty follows the procedure (or the standard); a figure typed here replaces it. */
export function RunBudgetDialog({ runId, title, dialUnit, canEdit, onClose }: RunBudgetDialogProps) {
  const budget = useRunBudget(runId);
  const loaded = budget.data ? toDraft(budget.data) : undefined;
  const form = useZodForm(runBudgetSchema, loaded ?? EMPTY, loaded);
  const update = useUpdateRunBudget({
    onSuccess: () => {
      notify('success', `Budget of run ${runId} saved; the results are computed again.`);
      onClose();
    },
  });

  const editable = canEdit && Boolean(budget.data?.editable);
  const effective = budget.data?.effective;
  const overrideExtras = form.watch('overrideExtras');
  const { control } = form;

  const field = (
    name: 'dialHalfDivision' | 'driftPpm' | 'driftHz' | 'counterResolutionHz',
    label: string,
    unit: string,
    follows: number | null | undefined,
  ) => (
    <FormTextField
      control={control}
      name={name}
      label={`${label} (${unit})`}
      inputMode="decimal"
      placeholder={follows === null || follows === undefined ? 'standard’s figure' : String(follows)}
      helperText={follows === null || follows === undefined ? 'Empty: the standard’s figure' : `Empty: ${follows} ${unit} from the procedure`}
      disabled={!editable}
      slotProps={{ inputLabel: { shrink: true } }}
    />
  );

  return (
    <FormDialog
      open
      title={title}
      form={form}
      onSubmit={(changes) => update.mutate({ runId, changes })}
      onClose={onClose}
      pending={update.isPending}
      error={update.error}
      errorFallback="The budget could not be saved."
      submitLabel="Save budget"
      pendingLabel="Saving…"
      readOnly={!editable}
      maxWidth="md"
      layout="custom"
    >
      {budget.isPending && <CircularProgress size={24} />}
      {budget.isError && <Alert severity="error">The budget could not be loaded.</Alert>}
      {budget.data && effective && (
        <>
          {!budget.data.editable && (
            <Alert severity="info" sx={{ mb: 2 }}>
              The job is signed: this budget is part of the issued certificate and cannot change.
            </Alert>
          )}
          <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
            Procedure: {effective.procedureName}.
            {budget.data.updatedAt && ` Last changed by ${budget.data.updatedByName ?? '—'} at ${formatDateTime(budget.data.updatedAt)}.`}
          </Typography>
          <Box sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: '1fr 1fr' }, gap: 2, mb: 2 }}>
            {field('dialHalfDivision', 'Half a dial division', dialUnit, effective.dialHalfDivision)}
            {field('counterResolutionHz', 'Counter resolution, ±1 count', 'Hz', effective.counterResolutionHz)}
            {field('driftPpm', 'Drift allowance', 'ppm', effective.driftPpm)}
            {field('driftHz', 'Drift allowance', 'Hz', effective.driftHz)}
          </Box>
          <FormSwitch control={control} name="overrideExtras" label="This run has its own extra components" disabled={!editable} />
          <Box sx={{ mt: 1, mb: 2 }}>
            <Controller
              control={control}
              name="extras"
              render={({ field: extras, fieldState }) => (
                <ExtraComponentsEditor
                  value={overrideExtras ? extras.value : toDrafts(effective.extraComponents)}
                  onChange={extras.onChange}
                  disabled={!editable || !overrideExtras}
                  error={fieldState.error?.message}
                />
              )}
            />
          </Box>
          <FormTextField
            control={control}
            name="note"
            label="Note"
            multiline
            minRows={2}
            helperText="Why the figures differ from the procedure’s"
            disabled={!editable}
          />
        </>
      )}
    </FormDialog>
  );
}
