import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { JOB_STATUSES, type Job, type ListJobsQuery } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter, type FilterOption } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { jobPath } from '@/config/paths';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDate } from '@/utils/format';
import { useJobs } from '../api/get-jobs';
import { JOB_STATUS_LABELS, JobStatusChip } from './job-status-chip';

const FILTER_KEYS = ['status', 'organizationId'] as const;
const SORT_FIELDS = ['number', 'status', 'receivedDate', 'updatedAt', 'organizationName', 'instrumentLabel', 'technicianName'];
const OPEN = 'received,in_progress,returned';
const STATUS_OPTIONS: FilterOption[] = [
  { value: OPEN, label: 'Open at the bench' },
  ...JOB_STATUSES.map((status) => ({ value: status, label: JOB_STATUS_LABELS[status] })),
];

type JobsTableProps = { customers?: readonly FilterOption[] };

// On a phone the job number and its status stay; the rest reads on a second line under the number.
const PHONE_LAYOUT: PhoneLayout<Job> = {
  keep: { number: 'fill', status: 140 },
  secondLine: (job) => [
    job.instrumentLabel,
    job.organizationName,
    `received ${formatDate(job.receivedDate)}`,
    job.technicianName,
    `${job.runCount} ${job.runCount === 1 ? 'run' : 'runs'}`,
  ],
};

export function JobsTable({ customers = [] }: JobsTableProps) {
  const list = useListSearchParams({ pageSize: 25, sort: '-receivedDate', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const { status, organizationId } = list.filters;
  const query: ListJobsQuery = {
    page: list.page,
    pageSize: list.pageSize,
    sort: list.sort || undefined,
    q: list.q || undefined,
    status: STATUS_OPTIONS.some((o) => o.value === status) ? status : undefined,
    organizationId: organizationId ? Number(organizationId) : undefined,
  };
  const jobs = useJobs({ query });

  const columns = useMemo<GridColDef<Job>[]>(
    () => [
      {
        field: 'number',
        headerName: 'Job',
        width: 120,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={jobPath(row.id)} underline="hover">
            <Num>{row.number}</Num>
          </Link>
        ),
      },
      { field: 'instrumentLabel', headerName: 'Instrument', flex: 1.4, minWidth: 220 },
      { field: 'organizationName', headerName: 'Customer', flex: 1, minWidth: 160 },
      { field: 'status', headerName: 'Status', width: 160, renderCell: ({ row }) => <JobStatusChip status={row.status} /> },
      { field: 'receivedDate', headerName: 'Received', width: 110, renderCell: ({ row }) => <Num>{formatDate(row.receivedDate)}</Num> },
      { field: 'technicianName', headerName: 'Technician', width: 140, valueFormatter: (v: string | null) => v ?? '—' },
      {
        field: 'runCount',
        headerName: 'Runs',
        width: 70,
        sortable: false,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Num>{row.runCount}</Num>,
      },
    ],
    [],
  );
  const layout = usePhoneColumns(columns, PHONE_LAYOUT);

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Job number, instrument or customer" value={list.q} onChange={(q) => list.update({ q })} />
        <SelectFilter
          label="Status"
          value={status}
          options={STATUS_OPTIONS}
          onChange={(v) => list.update({ status: v })}
          allLabel="Any status"
          minWidth={190}
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
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 230px)', minHeight: 360 }}>
        <ServerDataGrid
          label="Jobs"
          result={jobs}
          list={list}
          emptyText="No jobs match these filters."
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          sx={layout.sx}
        />
      </Paper>
    </>
  );
}
