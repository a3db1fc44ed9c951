import EditOutlined from '@mui/icons-material/EditOutlined';
import IconButton from '@mui/material/IconButton';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { formatRatePercent } from '@kilocycle/common/money';
import type { CustomerTerms } from '@kilocycle/common/types';
import { describeTerms } from '@/components/billing/billing-words';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { SearchField } from '@/components/ui/search-field';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { statementPath } from '@/config/paths';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDate } from '@/utils/format';
import { useCustomerTerms } from '../api/get-customer-terms';
import { CustomerTermsDialog } from './customer-terms-dialog';

const SORT_FIELDS = ['organizationName', 'paymentTerms', 'netDays', 'requiresQuote', 'updatedAt'];

function describeTax(terms: CustomerTerms): string {
  if (terms.taxRateId === null) return `Exempt${terms.taxRegistration ? ` (${terms.taxRegistration})` : ''}`;
  return `${terms.taxRateName ?? 'Rate'} ${formatRatePercent(terms.taxRateBasisPoints ?? 0)}`;
}

/** Each customer organisation's tax and payment terms (the defaults for one without its own); admin and lead change them. */
export function CustomerTermsTable({ canEdit }: { canEdit: boolean }) {
  const list = useListSearchParams({ pageSize: 25, sort: 'organizationName', sortFields: SORT_FIELDS });
  const terms = useCustomerTerms({ query: { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, q: list.q || undefined } });
  const [editing, setEditing] = useState<CustomerTerms | null>(null);

  const columns = useMemo<GridColDef<CustomerTerms>[]>(
    () => [
      { field: 'organizationName', headerName: 'Customer', flex: 1, minWidth: 200 },
      { field: 'tax', headerName: 'Tax', flex: 1, minWidth: 170, sortable: false, valueGetter: (_value, row) => describeTax(row) },
      { field: 'paymentTerms', headerName: 'Payment', width: 190, valueGetter: (_value, row) => describeTerms(row) },
      { field: 'requiresQuote', headerName: 'Quote first', width: 110, valueFormatter: (requires: boolean) => (requires ? 'Required' : '—') },
      {
        field: 'updatedAt',
        headerName: 'Set',
        width: 110,
        renderCell: ({ row }) => (row.updatedAt ? <Num>{formatDate(row.updatedAt)}</Num> : 'Defaults'),
      },
      {
        field: 'statement',
        headerName: 'Statement',
        width: 100,
        sortable: false,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={statementPath(row.organizationId)} aria-label={`Statement of ${row.organizationName}`}>
            Statement
          </Link>
        ),
      },
      ...(canEdit
        ? [
            {
              field: 'actions',
              ...unlabelledHeader<CustomerTerms>('Actions'),
              width: 60,
              sortable: false,
              disableColumnMenu: true,
              align: 'right',
              renderCell: ({ row }) => (
                <IconButton size="small" aria-label={`Edit the terms for ${row.organizationName}`} onClick={() => setEditing(row)}>
                  <EditOutlined fontSize="small" />
                </IconButton>
              ),
            } satisfies GridColDef<CustomerTerms>,
          ]
        : []),
    ],
    [canEdit],
  );
  const phoneLayout = useMemo<PhoneLayout<CustomerTerms>>(
    () => ({
      keep: { organizationName: 'fill', actions: 48 },
      secondLine: (row) => [describeTax(row), describeTerms(row), row.requiresQuote && 'quote first', !row.updatedAt && 'defaults'],
    }),
    [],
  );
  const layout = usePhoneColumns(columns, phoneLayout);

  return (
    <>
      <SearchField label="Search" placeholder="Customer" value={list.q} onChange={(q) => list.update({ q })} />
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 300px)', minHeight: 320, mt: 1.5 }}>
        <ServerDataGrid
          label="Customer terms"
          result={terms}
          list={list}
          emptyText="No customer organisations yet."
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          sx={layout.sx}
        />
      </Paper>
      {canEdit && <CustomerTermsDialog open={editing !== null} terms={editing} onClose={() => setEditing(null)} />}
    </>
  );
}
