import Box from '@mui/material/Box';
import { formatRatePercent } from '@kilocycle/common/money';
import { MAX_PAGE_SIZE, type CustomerTerms, type PaymentTerms } from '@kilocycle/common/types';
import { FormDialog, FormRadioGroup, FormSelectField, FormSwitch, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { numberSx } from '@/components/ui/num';
import { notify } from '@/lib/notifications';
import { useTaxRates } from '../api/get-tax-rates';
import { customerTermsSchema, EXEMPT, useUpdateCustomerTerms } from '../api/update-customer-terms';

type Draft = { tax: string; taxRegistration: string; paymentTerms: PaymentTerms; netDays: string; requiresQuote: boolean };

function toDraft(terms: CustomerTerms): Draft {
  return {
    tax: terms.taxRateId === null ? EXEMPT : String(terms.taxRateId),
    taxRegistration: terms.taxRegistration ?? '',
    paymentTerms: terms.paymentTerms,
    netDays: String(terms.netDays),
    requiresQuote: terms.requiresQuote,
  };
}

type CustomerTermsDialogProps = { open: boolean; terms: CustomerTerms | null; onClose: () => void };

/** A customer's tax treatment and payment terms (admin and lead). */
export function CustomerTermsDialog({ open, terms, onClose }: CustomerTermsDialogProps) {
  const initial: Draft = terms ? toDraft(terms) : { tax: '', taxRegistration: '', paymentTerms: 'pay_before_release', netDays: '0', requiresQuote: false };
  const form = useZodForm(customerTermsSchema, initial, initial);
  const rates = useTaxRates({ query: { active: true, pageSize: MAX_PAGE_SIZE, sort: 'name' }, enabled: open });
  const update = useUpdateCustomerTerms({
    onSuccess: (saved) => {
      notify('success', `Terms for ${saved.organizationName} saved.`);
      onClose();
    },
  });
  const [tax, paymentTerms] = form.watch(['tax', 'paymentTerms']);
  const rateOptions = (rates.data?.items ?? []).map((r) => ({ value: String(r.id), label: `${r.name} (${formatRatePercent(r.rateBasisPoints)})` }));
  // A rate since deactivated stays selectable for the customer that has it.
  if (terms?.taxRateId != null && !rateOptions.some((o) => o.value === String(terms.taxRateId)))
    rateOptions.push({ value: String(terms.taxRateId), label: `${terms.taxRateName ?? 'Rate'} (${formatRatePercent(terms.taxRateBasisPoints ?? 0)})` });

  return (
    <FormDialog
      open={open}
      title={terms ? `Terms for ${terms.organizationName}` : 'Customer terms'}
      intro="Applies to quotes and invoices priced from now on; sent quotes and issued invoices keep theirs."
      form={form}
      onSubmit={(body) => terms && update.mutate({ organizationId: terms.organizationId, terms: body })}
      onClose={onClose}
      onExited={() => update.reset()}
      pending={update.isPending}
      error={update.error}
      errorFallback="The terms could not be saved."
      submitLabel="Save"
      pendingLabel="Saving…"
    >
      <FormSelectField control={form.control} name="tax" label="Tax" required options={[...rateOptions, { value: EXEMPT, label: 'Exempt (no tax charged)' }]} />
      <FormTextField
        control={form.control}
        name="taxRegistration"
        label="Tax registration number"
        required={tax === EXEMPT}
        helperText={tax === EXEMPT ? 'Required for an exempt customer; printed on its invoices' : 'Printed on its invoices when given'}
        slotProps={{ htmlInput: { style: { fontFamily: numberSx.fontFamily } } }}
      />
      <FormRadioGroup
        control={form.control}
        name="paymentTerms"
        label="Payment"
        options={[
          { value: 'pay_before_release', label: 'Pays before the certificate is released' },
          { value: 'on_account', label: 'On account' },
        ]}
      />
      {paymentTerms === 'on_account' && (
        <Box sx={{ maxWidth: 220 }}>
          <FormTextField
            control={form.control}
            name="netDays"
            label="Days to pay"
            helperText="From the invoice date"
            slotProps={{ htmlInput: { inputMode: 'numeric', style: { fontFamily: numberSx.fontFamily } } }}
          />
        </Box>
      )}
      <FormSwitch control={form.control} name="requiresQuote" label="Work starts only once a quote is accepted" />
    </FormDialog>
  );
}
