import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { formatMoney } from '@kilocycle/common/money';
import { INVOICE_STATUSES, type Invoice, type ListInvoicesQuery } from '@kilocycle/common/types';
import { Money } from '@/components/billing/money';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter, type FilterOption } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { invoicePath, jobPath, statementPath } from '@/config/paths';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDate } from '@/utils/format';
import { useInvoices } from '../api/get-invoices';
import { INVOICE_STATUS_LABELS, InvoiceStatusChip } from './invoice-status-chip';

const SORT_FIELDS = ['number', 'status', 'issuedAt', 'dueDate'];
const FILTER_KEYS = ['status', 'overdue', 'organizationId'] as const;
const STATUS_OPTIONS: FilterOption[] = INVOICE_STATUSES.map((s) => ({ value: s, label: INVOICE_STATUS_LABELS[s] }));
const OVERDUE_OPTIONS: FilterOption[] = [
  { value: 'true', label: 'Overdue' },
  { value: 'false', label: 'Not overdue' },
];

const PHONE_LAYOUT: PhoneLayout<Invoice> = {
  keep: { number: 'fill', status: 120, balanceMinor: 100 },
  secondLine: (row) => [
    row.organizationName,
    `job ${row.jobNumber}`,
    row.issuedAt && `issued ${formatDate(row.issuedAt)}`,
    row.dueDate && `due ${row.dueDate}`,
    `total ${formatMoney(row.totals.grossMinor, row.currency)}`,
  ],
};

type InvoicesTableProps = { customers?: readonly FilterOption[] };

/** Every invoice of the lab, with its state, due date and balance; filtered by state, overdue and customer. */
export function InvoicesTable({ customers = [] }: InvoicesTableProps) {
  const list = useListSearchParams({ pageSize: 25, sort: '-issuedAt', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const { status, overdue, organizationId } = list.filters;
  const query: ListInvoicesQuery = {
    page: list.page,
    pageSize: list.pageSize,
    sort: list.sort || undefined,
    q: list.q || undefined,
    status: STATUS_OPTIONS.find((o) => o.value === status)?.value as ListInvoicesQuery['status'],
    overdue: overdue === 'true' ? true : overdue === 'false' ? false : undefined,
    organizationId: organizationId ? Number(organizationId) : undefined,
  };
  const invoices = useInvoices({ query });
  const customer = customers.find((c) => c.value === organizationId);

  const columns = useMemo<GridColDef<Invoice>[]>(
    () => [
      {
        field: 'number',
        headerName: 'Invoice',
        width: 130,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={invoicePath(row.id)} underline="hover">
            {row.number ? <Num>{row.number}</Num> : `Draft (job ${row.jobNumber})`}
          </Link>
        ),
      },
      {
        field: 'jobNumber',
        headerName: 'Job',
        width: 110,
        sortable: false,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={jobPath(row.jobId)} underline="hover">
            <Num>{row.jobNumber}</Num>
          </Link>
        ),
      },
      { field: 'organizationName', headerName: 'Customer', flex: 1, minWidth: 160, sortable: false },
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
        headerName: 'Balance',
        width: 120,
        sortable: false,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Money minor={row.balanceMinor} currency={row.currency} />,
      },
    ],
    [],
  );
  const layout = usePhoneColumns(columns, PHONE_LAYOUT);

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Invoice number" value={list.q} onChange={(q) => list.update({ q })} />
        <SelectFilter label="Status" value={status} options={STATUS_OPTIONS} onChange={(v) => list.update({ status: v })} allLabel="Any status" />
        <SelectFilter
          label="Overdue"
          value={overdue}
          options={OVERDUE_OPTIONS}
          onChange={(v) => list.update({ overdue: v })}
          allLabel="Either"
          minWidth={140}
        />
        {customers.length > 0 && (
          <SelectFilter
            label="Customer"
            value={organizationId}
            options={customers}
            onChange={(v) => list.update({ organizationId: v })}
            allLabel="All customers"
            minWidth={220}
          />
        )}
        {customer && (
          <Button component={RouterLink} to={statementPath(Number(customer.value))} size="small">
            Statement of {customer.label}
          </Button>
        )}
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 240px)', minHeight: 360 }}>
        <ServerDataGrid
          label="Invoices"
          result={invoices}
          list={list}
          emptyText="No invoices match these filters."
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          sx={layout.sx}
        />
      </Paper>
    </>
  );
}
