import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { z } from 'zod';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { isoDate } from '@/utils/form-schema';
import { exportInvoicesCsv } from '../api/export-invoices-csv';

const rangeSchema = z
  .object({ from: isoDate('Choose the first day'), to: isoDate('Choose the last day') })
  .refine((range) => range.from <= range.to, { path: ['to'], message: 'On or after the first day' });

const pad = (n: number) => String(n).padStart(2, '0');
/** The first and last day of last month, in local time: the usual period a bookkeeper asks for. */
function lastMonth(now = new Date()) {
  const first = new Date(now.getFullYear(), now.getMonth() - 1, 1);
  const last = new Date(now.getFullYear(), now.getMonth(), 0);
  const day = (d: Date) => `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`;
  return { from: day(first), to: day(last) };
}

/** The bookkeeper's CSV of invoices, payments, refunds and credit notes over a period (admin and lead). */
export function ExportInvoicesButton() {
  const [open, setOpen] = useState(false);
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<unknown>(null);
  const form = useZodForm(rangeSchema, lastMonth());
  const submit = async (range: { from: string; to: string }) => {
    setPending(true);
    setError(null);
    try {
      await exportInvoicesCsv(range);
      setOpen(false);
    } catch (failure) {
      setError(failure);
    } finally {
      setPending(false);
    }
  };
  return (
    <>
      <Button variant="outlined" startIcon={<DownloadOutlined />} onClick={() => setOpen(true)}>
        Export CSV
      </Button>
      <FormDialog
        open={open}
        title="Export for the bookkeeper"
        intro="A CSV file of the invoices, card payments, refunds and credit notes dated in the period, both days included."
        form={form}
        onSubmit={(range) => void submit(range)}
        onClose={() => setOpen(false)}
        onExited={() => setError(null)}
        pending={pending}
        error={error}
        errorFallback="The export could not be made."
        submitLabel="Download CSV"
        pendingLabel="Preparing…"
        layout="custom"
      >
        <Box sx={{ display: 'grid', gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', gap: 2, pt: 1 }}>
          <FormTextField control={form.control} name="from" label="From" type="date" slotProps={{ inputLabel: { shrink: true } }} />
          <FormTextField control={form.control} name="to" label="To" type="date" slotProps={{ inputLabel: { shrink: true } }} />
        </Box>
      </FormDialog>
    </>
  );
}
