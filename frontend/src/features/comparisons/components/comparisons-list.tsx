import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { SavedComparison } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { SearchField } from '@/components/ui/search-field';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDateTime } from '@/utils/format';
import { useComparisons } from '../api/get-comparisons';

const SORT_FIELDS = ['title', 'createdAt', 'updatedAt'];

/** Saved comparisons, newest first; each opens computed afresh from its runs. */
export function ComparisonsList({ comparisonPath }: { comparisonPath: (id: number) => string }) {
  const list = useListSearchParams({ pageSize: 25, sort: '-updatedAt', sortFields: SORT_FIELDS });
  const comparisons = useComparisons({ query: { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, q: list.q || undefined } });
  const columns = useMemo<GridColDef<SavedComparison>[]>(
    () => [
      {
        field: 'title',
        headerName: 'Comparison',
        flex: 1.6,
        minWidth: 260,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={comparisonPath(row.id)}>
            {row.title}
          </Link>
        ),
      },
      { field: 'instrumentLabel', headerName: 'Instrument', flex: 1.2, minWidth: 220, sortable: false },
      {
        field: 'kind',
        headerName: 'Runs',
        width: 140,
        sortable: false,
        valueGetter: (_v, row) => `${row.runIds.length} ${row.kind === 'warmup' ? 'warm-up' : 'stability'}`,
      },
      { field: 'labels', headerName: 'Labels', flex: 1.4, minWidth: 220, sortable: false, valueFormatter: (value: string[]) => value.join(' · ') },
      { field: 'createdByName', headerName: 'By', width: 130, sortable: false },
      { field: 'updatedAt', headerName: 'Changed', width: 150, renderCell: ({ row }) => <Num>{formatDateTime(row.updatedAt)}</Num> },
    ],
    [comparisonPath],
  );
  return (
    <>
      <SearchField label="Search" placeholder="Title or notes" value={list.q} onChange={(q) => list.update({ q })} />
      <Paper variant="outlined" sx={{ mt: 1.5, height: 'calc(100vh - 250px)', minHeight: 320 }}>
        <ServerDataGrid
          label="Saved comparisons"
          result={comparisons}
          list={list}
          emptyText="No saved comparisons yet."
          errorText="The comparisons could not be loaded."
          columns={columns}
        />
      </Paper>
    </>
  );
}
