import AddIcon from '@mui/icons-material/Add';
import EditOutlined from '@mui/icons-material/EditOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import { formatRatePercent } from '@kilocycle/common/money';
import type { TaxRate } from '@kilocycle/common/types';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { ActiveChip } from '@/components/ui/status-chip';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { useTaxRates } from '../api/get-tax-rates';
import { TaxRateDialog } from './tax-rate-dialog';

const SORT_FIELDS = ['name', 'rateBasisPoints', 'active'];

const PHONE_LAYOUT: PhoneLayout<TaxRate> = { keep: { name: 'fill', rateBasisPoints: 90, active: 110, actions: 48 }, secondLine: () => [] };

/** The tax rates a customer's terms choose from; admin and lead add and change them. */
export function TaxRatesTable({ canEdit }: { canEdit: boolean }) {
  const list = useListSearchParams({ pageSize: 25, sort: 'name', sortFields: SORT_FIELDS });
  const rates = useTaxRates({ query: { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined } });
  const [editing, setEditing] = useState<{ rate: TaxRate | null } | null>(null);

  const columns = useMemo<GridColDef<TaxRate>[]>(
    () => [
      { field: 'name', headerName: 'Name', flex: 1, minWidth: 180 },
      {
        field: 'rateBasisPoints',
        headerName: 'Rate',
        width: 110,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Num>{formatRatePercent(row.rateBasisPoints)}</Num>,
      },
      { field: 'active', headerName: 'State', width: 120, renderCell: ({ row }) => <ActiveChip active={row.active} /> },
      ...(canEdit
        ? [
            {
              field: 'actions',
              ...unlabelledHeader<TaxRate>('Actions'),
              width: 60,
              sortable: false,
              disableColumnMenu: true,
              align: 'right',
              renderCell: ({ row }) => (
                <IconButton size="small" aria-label={`Edit ${row.name}`} onClick={() => setEditing({ rate: row })}>
                  <EditOutlined fontSize="small" />
                </IconButton>
              ),
            } satisfies GridColDef<TaxRate>,
          ]
        : []),
    ],
    [canEdit],
  );
  const layout = usePhoneColumns(columns, PHONE_LAYOUT);

  return (
    <>
      {canEdit && (
        <Box sx={{ display: 'flex', justifyContent: 'flex-end', mb: 1.5 }}>
          <Button variant="contained" startIcon={<AddIcon />} onClick={() => setEditing({ rate: null })}>
            New tax rate
          </Button>
        </Box>
      )}
      <Paper variant="outlined" sx={{ height: 420 }}>
        <ServerDataGrid
          label="Tax rates"
          result={rates}
          list={list}
          emptyText="No tax rates yet. Customers are then charged no tax."
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          sx={layout.sx}
        />
      </Paper>
      {canEdit && <TaxRateDialog open={editing !== null} rate={editing?.rate ?? null} onClose={() => setEditing(null)} />}
    </>
  );
}
