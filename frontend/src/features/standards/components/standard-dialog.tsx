import Box from '@mui/material/Box';
import { STANDARD_KINDS, type ReferenceStandard, type StandardKind } from '@kilocycle/common/types';
import { FormDialog, FormSelectField, FormSwitch, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { numberSx } from '@/components/ui/num';
import { notify } from '@/lib/notifications';
import { standardSchema, useCreateStandard } from '../api/create-standard';
import { useUpdateStandard } from '../api/update-standard';

export const STANDARD_KIND_LABELS: Record<StandardKind, string> = { counter: 'Frequency counter', reference: 'Frequency reference' };

type Draft = Record<
  'name' | 'makeModel' | 'serial' | 'certificateNumber' | 'dueDate' | 'timebaseAccuracyPpm' | 'resolutionHz' | 'calibrationUPpm' | 'calibrationK',
  string
> & {
  kind: StandardKind;
  active: boolean;
};

const EMPTY: Draft = {
  name: '',
  kind: 'counter',
  makeModel: '',
  serial: '',
  certificateNumber: '',
  dueDate: '',
  timebaseAccuracyPpm: '',
  resolutionHz: '',
  calibrationUPpm: '',
  calibrationK: '2',
  active: true,
};

function fromStandard(s: ReferenceStandard): Draft {
  return {
    name: s.name,
    kind: s.kind,
    makeModel: s.makeModel,
    serial: s.serial,
    certificateNumber: s.certificateNumber,
    dueDate: s.dueDate.slice(0, 10),
    timebaseAccuracyPpm: String(s.timebaseAccuracyPpm),
    resolutionHz: String(s.resolutionHz),
    calibrationUPpm: String(s.calibrationUPpm),
    calibrationK: String(s.calibrationK),
    active: s.active,
  };
}

type StandardDialogProps = { open: boolean; standard: ReferenceStandard | null; onClose: () => void };

/** Create a reference standard, or change one (leads and administrators). */
export function StandardDialog({ open, standard, onClose }: StandardDialogProps) {
  const initial = standard ? fromStandard(standard) : EMPTY;
  const form = useZodForm(standardSchema, initial, initial);
  const done = (saved: ReferenceStandard) => {
    notify('success', `${saved.name} saved.`);
    onClose();
  };
  const create = useCreateStandard({ onSuccess: done });
  const update = useUpdateStandard({ onSuccess: done });
  const mono = { htmlInput: { style: { fontFamily: numberSx.fontFamily } } };

  return (
    <FormDialog
      open={open}
      title={standard ? `Edit ${standard.name} (version ${standard.version})` : 'New reference standard'}
      intro={standard && `Saving a change makes version ${standard.version + 1}. Open jobs use it at once; signed jobs keep the version they were signed with.`}
      form={form}
      onSubmit={({ active, ...body }) => (standard ? update.mutate({ id: standard.id, changes: { ...body, active } }) : create.mutate(body))}
      onClose={onClose}
      onExited={() => {
        create.reset();
        update.reset();
      }}
      pending={create.isPending || update.isPending}
      error={create.error ?? update.error}
      errorFallback="The standard could not be saved."
      submitLabel={standard ? 'Save' : 'Create standard'}
      pendingLabel="Saving…"
    >
      <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 2 }}>
        <FormTextField control={form.control} name="name" label="Name" helperText="As the bench knows it, e.g. Bench counter A" />
        <FormSelectField
          control={form.control}
          name="kind"
          label="Kind"
          options={STANDARD_KINDS.map((kind) => ({ value: kind, label: STANDARD_KIND_LABELS[kind] }))}
        />
        <FormTextField control={form.control} name="makeModel" label="Make and model" />
        <FormTextField control={form.control} name="serial" label="Serial number" slotProps={mono} />
        <FormTextField control={form.control} name="certificateNumber" label="Its certificate number" slotProps={mono} />
        <FormTextField control={form.control} name="dueDate" label="Calibration due" type="date" slotProps={{ inputLabel: { shrink: true } }} />
        <FormTextField control={form.control} name="timebaseAccuracyPpm" label="Time-base accuracy (± ppm)" slotProps={mono} />
        <FormTextField control={form.control} name="resolutionHz" label="Resolution (Hz, one count)" slotProps={mono} />
        <FormTextField
          control={form.control}
          name="calibrationUPpm"
          label="Its calibration U (ppm)"
          helperText="Expanded uncertainty from its certificate"
          slotProps={mono}
        />
        <FormTextField control={form.control} name="calibrationK" label="Coverage factor k" slotProps={mono} />
      </Box>
      {standard && <FormSwitch control={form.control} name="active" label="In use (a standard out of use cannot be chosen for new runs)" />}
    </FormDialog>
  );
}
