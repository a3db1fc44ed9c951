import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { Instrument, ListInstrumentsQuery } from '@kilocycle/common/types';
import { DueChip } from '@/components/ui/due-chip';
import { Num } from '@/components/ui/num';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter, type FilterOption } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { instrumentPath } from '@/config/paths';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDate } from '@/utils/format';
import { formatHzShort } from '@/utils/frequency';
import { useInstruments } from '../api/get-instruments';

const FILTER_KEYS = ['organizationId', 'due'] as const;
// What the API sorts instruments by.
const SORT_FIELDS = ['make', 'model', 'serial', 'assetTag', 'nextDueDate', 'organizationName', 'createdAt'];
const DUE_OPTIONS: FilterOption[] = [
  { value: 'overdue', label: 'Overdue' },
  { value: 'soon', label: 'Due within 30 days' },
];

function isoDateInDays(days: number) {
  const date = new Date();
  date.setDate(date.getDate() + days);
  return `${date.getFullYear()}-${String(date.getMonth() + 1).padStart(2, '0')}-${String(date.getDate()).padStart(2, '0')}`;
}

function spanOf(instrument: Instrument) {
  if (instrument.ranges.length === 0) return '—';
  const low = Math.min(...instrument.ranges.map((r) => r.freqMinHz));
  const high = Math.max(...instrument.ranges.map((r) => r.freqMaxHz));
  return `${formatHzShort(low)} – ${formatHzShort(high)}`;
}

type InstrumentsTableProps = {
  /** Owner organisations for the filter; leave empty to hide it (a client sees only its own). */
  owners?: readonly FilterOption[];
};

export function InstrumentsTable({ owners = [] }: InstrumentsTableProps) {
  const list = useListSearchParams({ pageSize: 25, sort: 'make', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const { organizationId, due } = list.filters;

  const query: ListInstrumentsQuery = {
    page: list.page,
    pageSize: list.pageSize,
    sort: list.sort || undefined,
    q: list.q || undefined,
    organizationId: organizationId ? Number(organizationId) : undefined,
    overdue: due === 'overdue' ? true : undefined,
    dueBefore: due === 'soon' ? isoDateInDays(30) : undefined,
  };
  const instruments = useInstruments({ query });

  const columns = useMemo<GridColDef<Instrument>[]>(
    () => [
      {
        field: 'make',
        headerName: 'Make',
        flex: 0.8,
        minWidth: 130,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={instrumentPath(row.id)} underline="hover">
            {row.make}
          </Link>
        ),
      },
      {
        field: 'model',
        headerName: 'Model',
        flex: 1.2,
        minWidth: 180,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={instrumentPath(row.id)} underline="hover" color="inherit">
            {row.model}
          </Link>
        ),
      },
      { field: 'serial', headerName: 'Serial', width: 120, renderCell: ({ row }) => <Num>{row.serial}</Num> },
      { field: 'assetTag', headerName: 'Asset tag', width: 100, renderCell: ({ row }) => <Num>{row.assetTag ?? '—'}</Num> },
      { field: 'organizationName', headerName: 'Owner', flex: 1, minWidth: 170 },
      {
        field: 'ranges',
        headerName: 'Ranges',
        sortable: false,
        flex: 1,
        minWidth: 210,
        renderCell: ({ row }) => (
          <Num>
            {row.ranges.length} · {spanOf(row)}
          </Num>
        ),
      },
      {
        field: 'nextDueDate',
        headerName: 'Next due',
        width: 200,
        renderCell: ({ row }) => (
          <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', height: '100%' }}>
            <Num>{formatDate(row.nextDueDate)}</Num>
            <DueChip date={row.nextDueDate} />
          </Box>
        ),
      },
    ],
    [],
  );

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Make, model, serial or asset tag" value={list.q} onChange={(q) => list.update({ q })} />
        {owners.length > 0 && (
          <SelectFilter
            label="Owner"
            value={organizationId}
            options={owners}
            onChange={(v) => list.update({ organizationId: v })}
            allLabel="All owners"
            minWidth={220}
          />
        )}
        <SelectFilter label="Due" value={due} options={DUE_OPTIONS} onChange={(v) => list.update({ due: v })} allLabel="Any date" minWidth={180} />
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 230px)', minHeight: 360 }}>
        <ServerDataGrid label="Instruments" result={instruments} list={list} emptyText="No instruments match these filters." columns={columns} />
      </Paper>
    </>
  );
}
