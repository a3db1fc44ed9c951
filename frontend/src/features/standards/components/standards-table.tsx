import AddIcon from '@mui/icons-material/Add';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import { alpha } from '@mui/material/styles';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import { STANDARD_KINDS, type ListStandardsQuery, type ReferenceStandard, type StandardKind } from '@kilocycle/common/types';
import { DueChip } from '@/components/ui/due-chip';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDate } from '@/utils/format';
import { formatNumber } from '@/utils/frequency';
import { useStandards } from '@/lib/get-standards';
import { STANDARD_KIND_LABELS, StandardDialog } from './standard-dialog';

const FILTER_KEYS = ['kind', 'active', 'overdue'] as const;
const SORT_FIELDS = ['name', 'kind', 'makeModel', 'serial', 'certificateNumber', 'dueDate', 'active'];
const KIND_OPTIONS = STANDARD_KINDS.map((kind) => ({ value: kind, label: STANDARD_KIND_LABELS[kind] }));
const ACTIVE_OPTIONS = [
  { value: 'true', label: 'In use' },
  { value: 'false', label: 'Out of use' },
];
const OVERDUE_OPTIONS = [
  { value: 'true', label: 'Overdue' },
  { value: 'false', label: 'In date' },
];

const isKind = (value: string): value is StandardKind => (STANDARD_KINDS as readonly string[]).includes(value);
const bool = (value: string) => (value === 'true' ? true : value === 'false' ? false : undefined);

/** The lab's counters and references with their due dates; leads and administrators add and change them. */
export function StandardsTable({ canEdit }: { canEdit: boolean }) {
  const list = useListSearchParams({ pageSize: 25, sort: 'dueDate', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const { kind, active, overdue } = list.filters;
  const query: ListStandardsQuery = {
    page: list.page,
    pageSize: list.pageSize,
    sort: list.sort || undefined,
    q: list.q || undefined,
    kind: isKind(kind) ? kind : undefined,
    active: bool(active),
    overdue: bool(overdue),
  };
  const standards = useStandards({ query });
  const [editing, setEditing] = useState<{ standard: ReferenceStandard | null } | null>(null);

  const columns = useMemo<GridColDef<ReferenceStandard>[]>(
    () => [
      { field: 'name', headerName: 'Name', flex: 1, minWidth: 160 },
      { field: 'kind', headerName: 'Kind', width: 160, valueFormatter: (value: StandardKind) => STANDARD_KIND_LABELS[value] ?? value },
      { field: 'makeModel', headerName: 'Make and model', flex: 1, minWidth: 170 },
      { field: 'serial', headerName: 'Serial', width: 120, renderCell: ({ row }) => <Num>{row.serial}</Num> },
      { field: 'certificateNumber', headerName: 'Certificate', width: 130, renderCell: ({ row }) => <Num>{row.certificateNumber}</Num> },
      {
        field: 'dueDate',
        headerName: 'Calibration due',
        width: 210,
        renderCell: ({ row }) => (
          <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', height: '100%' }}>
            <Num>{formatDate(row.dueDate)}</Num>
            <DueChip date={row.dueDate} />
          </Box>
        ),
      },
      {
        field: 'timebaseAccuracyPpm',
        headerName: 'Time base ± ppm',
        width: 130,
        sortable: false,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Num>{formatNumber(row.timebaseAccuracyPpm, row.timebaseAccuracyPpm < 0.01 ? 4 : 3)}</Num>,
      },
      {
        field: 'resolutionHz',
        headerName: 'Resolution Hz',
        width: 120,
        sortable: false,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Num>{row.resolutionHz}</Num>,
      },
      {
        field: 'active',
        headerName: 'Status',
        width: 110,
        renderCell: ({ row }) => (
          <Chip
            size="small"
            variant="outlined"
            label={row.active ? 'In use' : 'Out of use'}
            color={row.active ? 'success' : 'default'}
            sx={{ height: 20, fontSize: '0.75rem' }}
          />
        ),
      },
      ...(canEdit
        ? [
            {
              field: 'actions',
              ...unlabelledHeader('Actions'),
              width: 80,
              sortable: false,
              disableColumnMenu: true,
              renderCell: ({ row }) => (
                <Button size="small" aria-label={`Edit ${row.name}`} onClick={() => setEditing({ standard: row })}>
                  Edit
                </Button>
              ),
            } satisfies GridColDef<ReferenceStandard>,
          ]
        : []),
    ],
    [canEdit],
  );

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Name, model, serial or certificate" value={list.q} onChange={(q) => list.update({ q })} />
        <SelectFilter label="Kind" value={kind} options={KIND_OPTIONS} onChange={(v) => list.update({ kind: v })} allLabel="All kinds" />
        <SelectFilter label="Due" value={overdue} options={OVERDUE_OPTIONS} onChange={(v) => list.update({ overdue: v })} allLabel="Any date" />
        <SelectFilter label="Status" value={active} options={ACTIVE_OPTIONS} onChange={(v) => list.update({ active: v })} />
        <Box sx={{ flex: 1 }} />
        {canEdit && (
          <Button variant="contained" startIcon={<AddIcon />} onClick={() => setEditing({ standard: null })}>
            New standard
          </Button>
        )}
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 230px)', minHeight: 360 }}>
        <ServerDataGrid
          label="Reference standards"
          result={standards}
          list={list}
          emptyText="No standards match these filters."
          columns={columns}
          getRowClassName={({ row }) => (row.overdue ? 'kc-overdue' : '')}
          sx={(t) => ({
            border: 0,
            '& .kc-overdue': { backgroundColor: alpha(t.palette.error.main, 0.07) },
            '& .kc-overdue:hover': { backgroundColor: alpha(t.palette.error.main, 0.12) },
          })}
        />
      </Paper>
      <StandardDialog open={editing !== null} standard={editing?.standard ?? null} onClose={() => setEditing(null)} />
    </>
  );
}
