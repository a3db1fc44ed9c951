import AddIcon from '@mui/icons-material/Add';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableFooter from '@mui/material/TableFooter';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { formatMoney, formatRatePercent, MONEY_LIMITS } from '@kilocycle/common/money';
import type { BillingLine, BillingLineInput, DocumentTotals } from '@kilocycle/common/types';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { serverMessages } from '@/components/ui/form-dialog';
import { FormErrors } from '@/components/ui/form-errors';
import { HiddenLabel } from '@/components/ui/hidden-label';
import { numberSx } from '@/components/ui/num';
import { HIDE_ON_PHONE, PhoneSecondLine } from '@/components/ui/phone-columns';
import { describeQuantity } from './billing-words';
import { LineDialog } from './line-dialog';
import { Money } from './money';

/** A stored line as the list the server takes back (its figures are the server's to compute). */
export function toLineInput(line: BillingLine): BillingLineInput {
  return {
    priceItemId: line.priceItemId,
    code: line.code,
    description: line.description,
    unit: line.unit,
    quantityMilli: line.quantityMilli,
    unitPriceMinor: line.unitPriceMinor,
  };
}

type BillingLinesProps = {
  /** The table's accessible name, e.g. "Lines of quote Q-000004". */
  label: string;
  lines: readonly BillingLine[];
  totals: DocumentTotals;
  currency: string;
  taxExempt: boolean;
  taxRegistration?: string | null;
  /**
   * Given when the lines may change (a draft): saves the whole list; the server prices it and answers with the
   * document, whose lines and totals are then shown. Rejects with the server's refusal.
   */
  save?: (lines: BillingLineInput[]) => Promise<unknown>;
};

const right = { textAlign: 'right' } as const;

/** A quote's or invoice's lines with the server's figures per line and per tax rate; a draft's lines are edited here. */
export function BillingLines({ label, lines, totals, currency, taxExempt, taxRegistration, save }: BillingLinesProps) {
  const [editing, setEditing] = useState<{ index: number | null } | null>(null);
  const [removing, setRemoving] = useState<number | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<unknown>(null);
  const editable = save !== undefined;
  const inputs = lines.map(toLineInput);

  const submit = async (next: BillingLineInput[]) => {
    if (!save) return;
    setBusy(true);
    setError(null);
    try {
      await save(next);
      setEditing(null);
      setRemoving(null);
    } catch (failure) {
      setError(failure);
    } finally {
      setBusy(false);
    }
  };

  const onSaveLine = (line: BillingLineInput) => {
    const index = editing?.index ?? null;
    void submit(index === null ? [...inputs, line] : inputs.map((l, i) => (i === index ? line : l)));
  };

  const money = (minor: number) => formatMoney(minor, currency);
  const cell = { ...numberSx, ...right };

  return (
    <Box>
      {lines.length === 0 ? (
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          No lines yet.{editable ? ' Add one for each service.' : ''}
        </Typography>
      ) : (
        <Box sx={{ overflowX: 'auto' }}>
          <Table size="small" aria-label={label} sx={{ '& td, & th': { px: 1 } }}>
            <TableHead>
              <TableRow>
                <TableCell>Description</TableCell>
                <TableCell sx={{ ...HIDE_ON_PHONE, ...right }}>Quantity</TableCell>
                <TableCell sx={{ ...HIDE_ON_PHONE, ...right }}>Unit price</TableCell>
                <TableCell sx={right}>Net</TableCell>
                <TableCell sx={{ ...HIDE_ON_PHONE, ...right }}>Tax</TableCell>
                <TableCell sx={{ ...HIDE_ON_PHONE, ...right }}>Total</TableCell>
                {editable && (
                  <TableCell sx={right}>
                    <HiddenLabel>Actions</HiddenLabel>
                  </TableCell>
                )}
              </TableRow>
            </TableHead>
            <TableBody>
              {lines.map((line, index) => (
                <TableRow key={`${line.position}-${index}`}>
                  <TableCell sx={{ whiteSpace: 'pre-wrap', minWidth: 120 }}>
                    {line.description}
                    {line.code && (
                      <Typography component="div" variant="caption" color="text.secondary" sx={numberSx}>
                        {line.code}
                      </Typography>
                    )}
                    <PhoneSecondLine
                      parts={[
                        `${describeQuantity(line.quantityMilli, line.unit)} × ${money(line.unitPriceMinor)}`,
                        `tax ${money(line.taxMinor)}`,
                        `total ${money(line.grossMinor)}`,
                      ]}
                    />
                  </TableCell>
                  <TableCell sx={{ ...cell, ...HIDE_ON_PHONE }}>{describeQuantity(line.quantityMilli, line.unit)}</TableCell>
                  <TableCell sx={{ ...cell, ...HIDE_ON_PHONE }}>{money(line.unitPriceMinor)}</TableCell>
                  <TableCell sx={cell}>{money(line.netMinor)}</TableCell>
                  <TableCell sx={{ ...cell, ...HIDE_ON_PHONE }}>
                    {money(line.taxMinor)}
                    <Typography component="div" variant="caption" color="text.secondary">
                      {formatRatePercent(line.taxRateBasisPoints)}
                    </Typography>
                  </TableCell>
                  <TableCell sx={{ ...cell, ...HIDE_ON_PHONE }}>{money(line.grossMinor)}</TableCell>
                  {editable && (
                    <TableCell sx={{ ...right, whiteSpace: 'nowrap', py: 0, width: '1%' }}>
                      <IconButton size="small" aria-label={`Change line ${index + 1}: ${line.description}`} onClick={() => setEditing({ index })}>
                        <EditOutlined fontSize="small" />
                      </IconButton>
                      <IconButton size="small" color="error" aria-label={`Remove line ${index + 1}: ${line.description}`} onClick={() => setRemoving(index)}>
                        <DeleteOutlined fontSize="small" />
                      </IconButton>
                    </TableCell>
                  )}
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </Box>
      )}
      <Totals totals={totals} currency={currency} taxExempt={taxExempt} taxRegistration={taxRegistration ?? null} />
      {editable && (
        <Button
          size="small"
          startIcon={<AddIcon />}
          sx={{ mt: 1 }}
          disabled={lines.length >= MONEY_LIMITS.maxLines}
          onClick={() => {
            setError(null);
            setEditing({ index: null });
          }}
        >
          Add a line
        </Button>
      )}
      {editable && (
        <>
          <LineDialog
            open={editing !== null}
            line={editing?.index != null ? (inputs[editing.index] ?? null) : null}
            currency={currency}
            busy={busy}
            error={editing ? error : null}
            onSave={onSaveLine}
            onClose={() => setEditing(null)}
            onExited={() => setError(null)}
          />
          <ConfirmDialog
            open={removing !== null}
            title="Remove this line?"
            confirmLabel="Remove"
            destructive
            busy={busy}
            onClose={() => setRemoving(null)}
            onConfirm={() => removing !== null && void submit(inputs.filter((_, i) => i !== removing))}
          >
            {removing !== null && lines[removing]?.description}
            {removing !== null && <FormErrors messages={serverMessages(error, 'The line could not be removed.')} />}
          </ConfirmDialog>
        </>
      )}
    </Box>
  );
}

type TotalsProps = { totals: DocumentTotals; currency: string; taxExempt: boolean; taxRegistration: string | null };

/** Net and tax per rate, then the document's net, tax and total, all as the server computed them. */
export function Totals({ totals, currency, taxExempt, taxRegistration }: TotalsProps) {
  // The total sits in the table's footer, whose cells MUI prints small and grey: keep them the body's size and colour.
  const cell = (strong: boolean) => ({ border: 0, py: 0.25, fontSize: '0.875rem', color: 'text.primary', fontWeight: strong ? 600 : undefined });
  const row = (name: string, minor: number, strong = false) => (
    <TableRow key={name}>
      <TableCell sx={cell(strong)}>{name}</TableCell>
      <TableCell sx={cell(strong)}>
        <Money minor={minor} currency={currency} align="right" />
      </TableCell>
    </TableRow>
  );
  return (
    <Box sx={{ display: 'flex', flexDirection: 'column', alignItems: 'flex-end', mt: 1 }}>
      <Table size="small" aria-label="Totals" sx={{ width: 'auto', minWidth: { xs: '100%', sm: 320 } }}>
        <TableBody>
          {!taxExempt &&
            totals.byRate.length > 1 &&
            totals.byRate.flatMap((rate) => [
              row(`Net at ${formatRatePercent(rate.rateBasisPoints)}`, rate.netMinor),
              row(`Tax at ${formatRatePercent(rate.rateBasisPoints)}`, rate.taxMinor),
            ])}
          {row('Net', totals.netMinor)}
          {row(taxExempt ? 'Tax' : totals.byRate.length === 1 ? `Tax at ${formatRatePercent(totals.byRate[0]?.rateBasisPoints ?? 0)}` : 'Tax', totals.taxMinor)}
        </TableBody>
        <TableFooter>{row('Total', totals.grossMinor, true)}</TableFooter>
      </Table>
      {taxExempt && (
        <Typography variant="caption" color="text.secondary">
          No tax charged: the customer is exempt{taxRegistration ? ` (registration ${taxRegistration})` : ''}.
        </Typography>
      )}
    </Box>
  );
}
