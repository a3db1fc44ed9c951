import AddIcon from '@mui/icons-material/Add';
import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import type { PriceItem } from '@kilocycle/common/types';
import { PRICE_UNIT_LABELS } from '@/components/billing/billing-words';
import { Money } from '@/components/billing/money';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { ActiveChip } from '@/components/ui/status-chip';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { usePriceItems } from '@/lib/get-price-items';
import { PriceItemDialog } from './price-item-dialog';

const SORT_FIELDS = ['code', 'description', 'unit', 'unitPriceMinor', 'active'];
const FILTER_KEYS = ['active'] as const;
const ACTIVE_OPTIONS = [
  { value: 'true', label: 'Active' },
  { value: 'false', label: 'Deactivated' },
];

type PriceItemsTableProps = { canEdit: boolean };

/** The services the lab charges for, with their unit and price; admin and lead add and change them. */
export function PriceItemsTable({ canEdit }: PriceItemsTableProps) {
  const list = useListSearchParams({ pageSize: 25, sort: 'code', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const active = list.filters.active === 'true' ? true : list.filters.active === 'false' ? false : undefined;
  const items = usePriceItems({ query: { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, q: list.q || undefined, active } });
  const currency = items.data?.currency;
  const [editing, setEditing] = useState<{ item: PriceItem | null } | null>(null);

  const columns = useMemo<GridColDef<PriceItem>[]>(
    () => [
      { field: 'code', headerName: 'Code', width: 130, renderCell: ({ row }) => <Num>{row.code}</Num> },
      { field: 'description', headerName: 'Description', flex: 1, minWidth: 220 },
      { field: 'unit', headerName: 'Unit', width: 150, valueFormatter: (unit: PriceItem['unit']) => PRICE_UNIT_LABELS[unit] },
      {
        field: 'unitPriceMinor',
        headerName: 'Unit price',
        width: 130,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => (currency ? <Money minor={row.unitPriceMinor} currency={currency} /> : '—'),
      },
      {
        field: 'proposeOnQuotes',
        headerName: 'On new quotes',
        width: 130,
        sortable: false,
        valueFormatter: (propose: boolean) => (propose ? 'Proposed' : '—'),
      },
      { field: 'active', headerName: 'State', width: 120, renderCell: ({ row }) => <ActiveChip active={row.active} /> },
      ...(canEdit
        ? [
            {
              field: 'actions',
              ...unlabelledHeader<PriceItem>('Actions'),
              width: 60,
              sortable: false,
              disableColumnMenu: true,
              align: 'right',
              renderCell: ({ row }) => (
                <IconButton size="small" aria-label={`Edit ${row.code}`} onClick={() => setEditing({ item: row })}>
                  <EditOutlined fontSize="small" />
                </IconButton>
              ),
            } satisfies GridColDef<PriceItem>,
          ]
        : []),
    ],
    [canEdit, currency],
  );
  const phoneLayout = useMemo<PhoneLayout<PriceItem>>(
    () => ({
      keep: { code: 'fill', unitPriceMinor: 100, actions: 48 },
      secondLine: (row) => [
        row.description,
        PRICE_UNIT_LABELS[row.unit].toLowerCase(),
        row.proposeOnQuotes && 'proposed on new quotes',
        !row.active && 'deactivated',
      ],
    }),
    [],
  );
  const layout = usePhoneColumns(columns, phoneLayout);

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Code or description" value={list.q} onChange={(q) => list.update({ q })} />
        <SelectFilter label="State" value={list.filters.active} options={ACTIVE_OPTIONS} onChange={(v) => list.update({ active: v })} allLabel="Any state" />
        <Box sx={{ flex: 1 }} />
        {canEdit && (
          <Button variant="contained" startIcon={<AddIcon />} disabled={!currency} onClick={() => setEditing({ item: null })}>
            New price item
          </Button>
        )}
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 300px)', minHeight: 320 }}>
        <ServerDataGrid
          label="Price items"
          result={items}
          list={list}
          emptyText={canEdit ? 'No price items yet. Add the services the lab charges for.' : 'No price items yet.'}
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          sx={layout.sx}
        />
      </Paper>
      {canEdit && currency && <PriceItemDialog open={editing !== null} item={editing?.item ?? null} currency={currency} onClose={() => setEditing(null)} />}
      {currency && (
        <Box component="p" sx={{ typography: 'caption', color: 'text.secondary', mt: 1 }}>
          Prices are in {currency}, before tax. Tax is added per customer, from their terms.
        </Box>
      )}
    </>
  );
}
