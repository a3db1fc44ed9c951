import Box from '@mui/material/Box';
import { moneyEditText } from '@kilocycle/common/money';
import { PRICE_UNITS, type PriceItem, type PriceUnit } from '@kilocycle/common/types';
import { useMemo } from 'react';
import { PRICE_UNIT_LABELS } from '@/components/billing/billing-words';
import { FormDialog, FormSelectField, FormSwitch, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { numberSx } from '@/components/ui/num';
import { notify } from '@/lib/notifications';
import { priceItemSchema, useCreatePriceItem } from '../api/create-price-item';
import { useUpdatePriceItem } from '../api/update-price-item';

type Draft = { code: string; description: string; unit: PriceUnit; unitPrice: string; proposeOnQuotes: boolean; active: boolean };

const EMPTY: Draft = { code: '', description: '', unit: 'per_range', unitPrice: '', proposeOnQuotes: true, active: true };

type PriceItemDialogProps = { open: boolean; item: PriceItem | null; currency: string; onClose: () => void };

/** Add a service to the price list, or change one (admin and lead). */
export function PriceItemDialog({ open, item, currency, onClose }: PriceItemDialogProps) {
  const schema = useMemo(() => priceItemSchema(currency), [currency]);
  const initial: Draft = item
    ? {
        code: item.code,
        description: item.description,
        unit: item.unit,
        unitPrice: moneyEditText(item.unitPriceMinor, currency),
        proposeOnQuotes: item.proposeOnQuotes,
        active: item.active,
      }
    : EMPTY;
  const form = useZodForm(schema, initial, initial);
  const done = (saved: PriceItem) => {
    notify('success', `${saved.code} saved.`);
    onClose();
  };
  const create = useCreatePriceItem({ onSuccess: done });
  const update = useUpdatePriceItem({ onSuccess: done });
  const mono = { htmlInput: { style: { fontFamily: numberSx.fontFamily } } };

  return (
    <FormDialog
      open={open}
      title={item ? `Edit ${item.code}` : 'New price item'}
      intro={item && 'A change applies to quotes and invoices priced from now on; sent quotes and issued invoices keep their figures.'}
      form={form}
      onSubmit={({ unitPrice, active, ...body }) =>
        item ? update.mutate({ id: item.id, changes: { ...body, unitPriceMinor: unitPrice, active } }) : create.mutate({ ...body, unitPriceMinor: unitPrice })
      }
      onClose={onClose}
      onExited={() => {
        create.reset();
        update.reset();
      }}
      pending={create.isPending || update.isPending}
      error={create.error ?? update.error}
      errorFallback="The price item could not be saved."
      submitLabel={item ? 'Save' : 'Add to the price list'}
      pendingLabel="Saving…"
    >
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', sm: 'repeat(2, minmax(0, 1fr))' }, gap: 2 }}>
        <FormTextField control={form.control} name="code" label="Code" required helperText="The lab's own, e.g. CAL-RANGE" slotProps={mono} />
        <FormSelectField control={form.control} name="unit" label="Unit" options={PRICE_UNITS.map((u) => ({ value: u, label: PRICE_UNIT_LABELS[u] }))} />
      </Box>
      <FormTextField control={form.control} name="description" label="Description" required multiline helperText="As printed on quotes and invoices" />
      <FormTextField control={form.control} name="unitPrice" label={`Unit price (${currency})`} required helperText="Before tax, e.g. 85.00" slotProps={mono} />
      <FormSwitch control={form.control} name="proposeOnQuotes" label="Propose on every new quote" />
      {item && <FormSwitch control={form.control} name="active" label="Active (offered on new lines)" />}
    </FormDialog>
  );
}
