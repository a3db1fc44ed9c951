import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { formatMoney } from '@kilocycle/common/money';
import { INVOICE_STATUSES, type Invoice, type ListInvoicesQuery } from '@kilocycle/common/types';
import { Money } from '@/components/billing/money';
import { PdfButton } from '@/components/billing/pdf-button';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { SelectFilter } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { portalInvoicePath } from '@/config/paths';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { useCurrentUser } from '@/lib/auth';
import { formatDate } from '@/utils/format';
import { downloadInvoicePdf } from '../api/download-invoice-pdf';
import { useInvoices } from '../api/get-invoices';
import { useStatement } from '../api/get-statement';
import { INVOICE_STATUS_LABELS, InvoiceStatusChip } from './invoice-status-chip';
import { payable } from '../utils/payable';
import { PayInvoiceButton } from './pay-invoice-button';
import { StatementTotals } from './statement-view';

const SORT_FIELDS = ['number', 'status', 'issuedAt', 'dueDate'];
const FILTER_KEYS = ['status'] as const;
// A client never sees a draft.
const STATUS_OPTIONS = INVOICE_STATUSES.filter((s) => s !== 'draft').map((s) => ({ value: s, label: INVOICE_STATUS_LABELS[s] }));

/** A client's invoices: the account's totals, each invoice's state and balance, its PDF, and the card payment. */
export function PortalInvoices() {
  const user = useCurrentUser();
  const statement = useStatement({ organizationId: user.organizationId });
  const list = useListSearchParams({ pageSize: 25, sort: '-issuedAt', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const status = STATUS_OPTIONS.find((o) => o.value === list.filters.status)?.value;
  const query: ListInvoicesQuery = { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, status };
  const invoices = useInvoices({ query });

  const columns = useMemo<GridColDef<Invoice>[]>(
    () => [
      {
        field: 'number',
        headerName: 'Invoice',
        width: 130,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={portalInvoicePath(row.id)} underline="hover">
            <Num>{row.number ?? '—'}</Num>
          </Link>
        ),
      },
      { field: 'jobNumber', headerName: 'Job', width: 110, sortable: false, renderCell: ({ row }) => <Num>{row.jobNumber}</Num> },
      { field: 'status', headerName: 'Status', width: 160, renderCell: ({ row }) => <InvoiceStatusChip invoice={row} /> },
      { field: 'issuedAt', headerName: 'Issued', width: 110, renderCell: ({ row }) => <Num>{formatDate(row.issuedAt)}</Num> },
      { field: 'dueDate', headerName: 'Due', width: 110, renderCell: ({ row }) => <Num>{row.dueDate ?? '—'}</Num> },
      {
        field: 'total',
        headerName: 'Total',
        width: 120,
        sortable: false,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Money minor={row.totals.grossMinor} currency={row.currency} />,
      },
      {
        field: 'balanceMinor',
        headerName: 'To pay',
        width: 120,
        sortable: false,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Money minor={row.balanceMinor} currency={row.currency} />,
      },
      {
        field: 'actions',
        ...unlabelledHeader<Invoice>('Actions'),
        flex: 1,
        minWidth: 200,
        sortable: false,
        disableColumnMenu: true,
        align: 'right',
        renderCell: ({ row }) => (
          <Box sx={{ display: 'flex', gap: 0.5, alignItems: 'center', justifyContent: 'flex-end' }}>
            <PdfButton download={() => downloadInvoicePdf(row)} ariaLabel={`Download invoice ${row.number ?? ''} as PDF`} />
            {payable(row) && <PayInvoiceButton invoiceId={row.id} invoiceNumber={row.number} />}
          </Box>
        ),
      },
    ],
    [],
  );
  const phoneLayout = useMemo<PhoneLayout<Invoice>>(
    () => ({
      keep: { number: 'fill', actions: 190 },
      secondLine: (row) => [
        `job ${row.jobNumber}`,
        INVOICE_STATUS_LABELS[row.status].toLowerCase(),
        row.overdue && 'overdue',
        row.dueDate && `due ${row.dueDate}`,
        `to pay ${formatMoney(row.balanceMinor, row.currency)}`,
      ],
    }),
    [],
  );
  const layout = usePhoneColumns(columns, phoneLayout);

  return (
    <>
      {statement.data && (
        <Box sx={{ mb: 2 }}>
          <StatementTotals statement={statement.data} />
        </Box>
      )}
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap' }}>
        <SelectFilter label="Status" value={list.filters.status} options={STATUS_OPTIONS} onChange={(v) => list.update({ status: v })} allLabel="Any status" />
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 340px)', minHeight: 320 }}>
        <ServerDataGrid
          label="Invoices"
          result={invoices}
          list={list}
          emptyText="No invoices from the lab yet."
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          sx={layout.sx}
        />
      </Paper>
    </>
  );
}
