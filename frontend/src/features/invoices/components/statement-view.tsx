import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { formatMoney } from '@kilocycle/common/money';
import type { Statement, StatementLine } from '@kilocycle/common/types';
import { Money } from '@/components/billing/money';
import { Num, numberSx } from '@/components/ui/num';
import { HIDE_ON_PHONE, PhoneSecondLine } from '@/components/ui/phone-columns';
import { ApiError } from '@/lib/api-client';
import { formatDate } from '@/utils/format';
import { useStatement } from '../api/get-statement';

const KIND_LABELS: Record<StatementLine['kind'], string> = {
  invoice: 'Invoice',
  payment: 'Payment',
  refund: 'Refund',
  credit_note: 'Credit note',
};

function Figure({ label, minor, currency, tone }: { label: string; minor: number; currency: string; tone?: 'error' }) {
  return (
    <Paper variant="outlined" sx={{ p: 1.5, minWidth: 0 }}>
      <Typography variant="caption" color="text.secondary" component="div">
        {label}
      </Typography>
      <Money minor={minor} currency={currency} sx={{ fontSize: '1.15rem', color: tone === 'error' && minor !== 0 ? 'error.main' : undefined }} />
    </Paper>
  );
}

/** The four totals a customer's account comes down to. */
export function StatementTotals({ statement }: { statement: Statement }) {
  const { currency } = statement;
  return (
    <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'repeat(2, minmax(0, 1fr))', md: 'repeat(4, minmax(0, 1fr))' }, gap: 1.5 }}>
      <Figure label="Open (owed)" minor={statement.openMinor} currency={currency} />
      <Figure label="Of which overdue" minor={statement.overdueMinor} currency={currency} tone="error" />
      <Figure label="Paid" minor={statement.paidMinor} currency={currency} />
      <Figure label="Credited" minor={statement.creditMinor} currency={currency} />
    </Box>
  );
}

/** A customer's statement: totals as of today, then every invoice, payment, refund and credit note with the running balance. */
export function StatementView({ organizationId }: { organizationId: number }) {
  const statement = useStatement({ organizationId });
  if (statement.isPending) return <Typography color="text.secondary">Loading…</Typography>;
  if (statement.isError) {
    const missing = statement.error instanceof ApiError && statement.error.status === 404;
    return <Alert severity={missing ? 'info' : 'error'}>{missing ? 'There is no such customer, or it is not yours to see.' : statement.error.message}</Alert>;
  }
  const s = statement.data;
  const money = (minor: number) => formatMoney(minor, s.currency);
  const cell = { ...numberSx, textAlign: 'right' } as const;
  return (
    <Box>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
        {s.organizationName} · as of <Num>{formatDate(s.asOf)}</Num> · in {s.currency}
      </Typography>
      <StatementTotals statement={s} />
      <Paper variant="outlined" sx={{ mt: 2, p: 2, overflowX: 'auto' }}>
        <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
          Account
        </Typography>
        {s.lines.length === 0 ? (
          <Typography variant="body2" color="text.secondary">
            Nothing invoiced yet.
          </Typography>
        ) : (
          <Table size="small" aria-label="Statement lines" sx={{ '& td, & th': { px: 1 } }}>
            <TableHead>
              <TableRow>
                <TableCell>Date</TableCell>
                <TableCell>What</TableCell>
                <TableCell sx={HIDE_ON_PHONE}>Invoice</TableCell>
                <TableCell sx={{ textAlign: 'right' }}>Amount</TableCell>
                <TableCell sx={{ ...HIDE_ON_PHONE, textAlign: 'right' }}>Balance</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {s.lines.map((line, index) => (
                <TableRow key={`${line.reference}-${index}`}>
                  <TableCell sx={numberSx}>{formatDate(line.date)}</TableCell>
                  <TableCell>
                    {KIND_LABELS[line.kind]} <Num>{line.reference}</Num>
                    <PhoneSecondLine
                      parts={[line.invoiceNumber && line.kind !== 'invoice' && `invoice ${line.invoiceNumber}`, `balance ${money(line.balanceMinor)}`]}
                    />
                  </TableCell>
                  <TableCell sx={{ ...numberSx, ...HIDE_ON_PHONE }}>{line.invoiceNumber ?? '—'}</TableCell>
                  <TableCell sx={cell}>{money(line.amountMinor)}</TableCell>
                  <TableCell sx={{ ...cell, ...HIDE_ON_PHONE }}>{money(line.balanceMinor)}</TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        )}
      </Paper>
    </Box>
  );
}
