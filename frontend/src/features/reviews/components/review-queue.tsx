import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { Job } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { SearchField } from '@/components/ui/search-field';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDate, formatDateTime } from '@/utils/format';
import { useReviewQueue } from '../api/get-review-queue';

const SORT_FIELDS = ['number', 'receivedDate', 'updatedAt', 'organizationName', 'instrumentLabel'];

/** Jobs waiting for the lead, the longest-waiting first. */
export function ReviewQueue({ reviewPath }: { reviewPath: (jobId: number) => string }) {
  const list = useListSearchParams({ pageSize: 25, sort: 'updatedAt', sortFields: SORT_FIELDS });
  const queue = useReviewQueue({ query: { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, q: list.q || undefined } });

  const columns = useMemo<GridColDef<Job>[]>(
    () => [
      {
        field: 'number',
        headerName: 'Job',
        width: 130,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={reviewPath(row.id)} aria-label={`Review job ${row.number}`}>
            <Num>{row.number}</Num>
          </Link>
        ),
      },
      { field: 'instrumentLabel', headerName: 'Instrument', flex: 1.4, minWidth: 220 },
      { field: 'organizationName', headerName: 'Customer', flex: 1, minWidth: 160 },
      { field: 'technicianName', headerName: 'Technician', width: 150, sortable: false, valueFormatter: (v: string | null) => v ?? '—' },
      { field: 'runCount', headerName: 'Runs', width: 70, sortable: false, align: 'right', headerAlign: 'right' },
      { field: 'receivedDate', headerName: 'Received', width: 110, renderCell: ({ row }) => <Num>{formatDate(row.receivedDate)}</Num> },
      { field: 'updatedAt', headerName: 'Submitted', width: 150, renderCell: ({ row }) => <Num>{formatDateTime(row.updatedAt)}</Num> },
    ],
    [reviewPath],
  );

  return (
    <>
      <SearchField label="Search" placeholder="Job, instrument or customer" value={list.q} onChange={(q) => list.update({ q })} />
      <Paper variant="outlined" sx={{ mt: 1.5, height: 'calc(100vh - 240px)', minHeight: 320 }}>
        <ServerDataGrid
          label="Jobs waiting for review"
          result={queue}
          list={list}
          emptyText="Nothing is waiting for review."
          errorText="The queue could not be loaded."
          columns={columns}
        />
      </Paper>
    </>
  );
}
