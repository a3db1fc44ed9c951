import InputAdornment from '@mui/material/InputAdornment';
import { formatRatePercent } from '@kilocycle/common/money';
import type { TaxRate } from '@kilocycle/common/types';
import { FormDialog, FormSwitch, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { numberSx } from '@/components/ui/num';
import { notify } from '@/lib/notifications';
import { taxRateSchema, useCreateTaxRate } from '../api/create-tax-rate';
import { useUpdateTaxRate } from '../api/update-tax-rate';

type TaxRateDialogProps = { open: boolean; rate: TaxRate | null; onClose: () => void };

/** Add a tax rate, or rename, change or deactivate one (admin and lead). */
export function TaxRateDialog({ open, rate, onClose }: TaxRateDialogProps) {
  const initial = rate
    ? { name: rate.name, rate: formatRatePercent(rate.rateBasisPoints).replace(/\s*%$/, ''), active: rate.active }
    : { name: '', rate: '', active: true };
  const form = useZodForm(taxRateSchema, initial, initial);
  const done = (saved: TaxRate) => {
    notify('success', `${saved.name} saved.`);
    onClose();
  };
  const create = useCreateTaxRate({ onSuccess: done });
  const update = useUpdateTaxRate({ onSuccess: done });

  return (
    <FormDialog
      open={open}
      title={rate ? `Edit ${rate.name}` : 'New tax rate'}
      intro={rate && 'A change applies to lines priced from now on; sent quotes and issued invoices keep the rate they were priced with.'}
      form={form}
      onSubmit={({ name, rate: basisPoints, active }) =>
        rate ? update.mutate({ id: rate.id, changes: { name, rateBasisPoints: basisPoints, active } }) : create.mutate({ name, rateBasisPoints: basisPoints })
      }
      onClose={onClose}
      onExited={() => {
        create.reset();
        update.reset();
      }}
      pending={create.isPending || update.isPending}
      error={create.error ?? update.error}
      errorFallback="The tax rate could not be saved."
      submitLabel={rate ? 'Save' : 'Add the rate'}
      pendingLabel="Saving…"
    >
      <FormTextField control={form.control} name="name" label="Name" required helperText="e.g. Standard rate" />
      <FormTextField
        control={form.control}
        name="rate"
        label="Rate"
        required
        helperText="Up to two decimals, e.g. 17.5"
        slotProps={{ htmlInput: { style: { fontFamily: numberSx.fontFamily } }, input: { endAdornment: <InputAdornment position="end">%</InputAdornment> } }}
      />
      {rate && <FormSwitch control={form.control} name="active" label="Active (offered for customer terms)" />}
    </FormDialog>
  );
}
