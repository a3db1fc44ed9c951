import Box from '@mui/material/Box';
import { MONEY_LIMITS, moneyEditText, formatQuantityMilli } from '@kilocycle/common/money';
import { MAX_PAGE_SIZE, PRICE_UNITS, type BillingLineInput, type PriceUnit } from '@kilocycle/common/types';
import { useMemo } from 'react';
import { z } from 'zod';
import { FormDialog, FormSelectField, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { numberSx } from '@/components/ui/num';
import { usePriceItems } from '@/lib/get-price-items';
import { optionalText, requiredText, typedMoney, typedQuantity } from '@/utils/form-schema';
import { PRICE_UNIT_LABELS } from './billing-words';

/** Longest code and description a line takes here; the server has the last word and its refusal is shown. */
export const LINE_LIMITS = { code: 40, description: 500 } as const;

/** One line's form: every figure as typed, read exactly by common's parsers (never floating point). */
export const billingLineSchema = (currency: string) =>
  z.object({
    priceItemId: z.string(),
    code: optionalText(LINE_LIMITS.code),
    description: requiredText(LINE_LIMITS.description, 'Say what the line is for'),
    unit: z.enum(PRICE_UNITS),
    quantity: typedQuantity(MONEY_LIMITS.maxQuantityMilli),
    unitPrice: typedMoney(currency, MONEY_LIMITS.maxUnitPriceMinor),
  });

type Draft = { priceItemId: string; code: string; description: string; unit: PriceUnit; quantity: string; unitPrice: string };

const EMPTY: Draft = { priceItemId: '', code: '', description: '', unit: 'per_job', quantity: '1', unitPrice: '' };

function toDraft(line: BillingLineInput, currency: string): Draft {
  return {
    priceItemId: line.priceItemId ? String(line.priceItemId) : '',
    code: line.code ?? '',
    description: line.description,
    unit: line.unit,
    quantity: formatQuantityMilli(line.quantityMilli),
    unitPrice: moneyEditText(line.unitPriceMinor, currency),
  };
}

type LineDialogProps = {
  open: boolean;
  /** The line being changed, or null for a new one. */
  line: BillingLineInput | null;
  currency: string;
  busy: boolean;
  error: unknown;
  onSave: (line: BillingLineInput) => void;
  onClose: () => void;
  onExited?: () => void;
};

const mono = { htmlInput: { style: { fontFamily: numberSx.fontFamily } } };

/** Add or change one line of a draft quote or invoice; the server prices it and answers with the figures. */
export function LineDialog({ open, line, currency, busy, error, onSave, onClose, onExited }: LineDialogProps) {
  const schema = useMemo(() => billingLineSchema(currency), [currency]);
  const initial = line ? toDraft(line, currency) : EMPTY;
  const form = useZodForm(schema, initial, initial);
  const priceItems = usePriceItems({ query: { active: true, pageSize: MAX_PAGE_SIZE, sort: 'code' }, enabled: open });
  const items = priceItems.data?.items ?? [];

  const pick = (id: string) => {
    const item = items.find((i) => String(i.id) === id);
    if (!item) return;
    form.setValue('code', item.code);
    form.setValue('description', item.description);
    form.setValue('unit', item.unit);
    form.setValue('unitPrice', moneyEditText(item.unitPriceMinor, currency));
  };

  return (
    <FormDialog
      open={open}
      title={line ? 'Change the line' : 'Add a line'}
      form={form}
      onSubmit={({ priceItemId, quantity, unitPrice, ...rest }) =>
        onSave({ ...rest, priceItemId: priceItemId ? Number(priceItemId) : null, quantityMilli: quantity, unitPriceMinor: unitPrice })
      }
      onClose={onClose}
      onExited={onExited}
      pending={busy}
      error={error}
      errorFallback="The line could not be saved."
      submitLabel={line ? 'Save the line' : 'Add the line'}
      pendingLabel="Saving…"
    >
      {items.length > 0 && (
        <FormSelectField
          control={form.control}
          name="priceItemId"
          label="From the price list"
          helperText="Fills in the code, description, unit and price; change them as needed"
          onValueChange={pick}
          options={[{ value: '', label: 'None (a line of its own)' }, ...items.map((i) => ({ value: String(i.id), label: `${i.code} — ${i.description}` }))]}
        />
      )}
      <FormTextField control={form.control} name="description" label="Description" required multiline />
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', sm: 'repeat(2, minmax(0, 1fr))' }, gap: 2 }}>
        <FormTextField control={form.control} name="code" label="Code" slotProps={mono} />
        <FormSelectField control={form.control} name="unit" label="Unit" options={PRICE_UNITS.map((u) => ({ value: u, label: PRICE_UNIT_LABELS[u] }))} />
        <FormTextField control={form.control} name="quantity" label="Quantity" required helperText="Up to three decimals, e.g. 1.5" slotProps={mono} />
        <FormTextField
          control={form.control}
          name="unitPrice"
          label={`Unit price (${currency})`}
          required
          helperText="Before tax, e.g. 85.00"
          slotProps={mono}
        />
      </Box>
    </FormDialog>
  );
}
