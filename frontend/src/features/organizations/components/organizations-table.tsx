import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Tooltip from '@mui/material/Tooltip';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import { ORGANIZATION_KINDS, type Organization, type OrganizationKind } from '@kilocycle/common/types';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { ActiveChip } from '@/components/ui/status-chip';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { useCurrentUser } from '@/lib/auth';
import { formatDate } from '@/utils/format';
import { useOrganizations, type OrganizationsQuery } from '../api/get-organizations';
import { useUpdateOrganization } from '../api/update-organization';

const KIND_LABELS: Record<OrganizationKind, string> = { lab: 'Lab', customer: 'Customer' };

const FILTER_KEYS = ['kind', 'active'] as const;
const SORT_FIELDS = ['name', 'kind', 'createdAt'];
const KIND_OPTIONS = ORGANIZATION_KINDS.map((kind) => ({ value: kind, label: KIND_LABELS[kind] }));
const STATUS_OPTIONS = [
  { value: 'true', label: 'Active' },
  { value: 'false', label: 'Deactivated' },
];

function isKind(value: string): value is OrganizationKind {
  return (ORGANIZATION_KINDS as readonly string[]).includes(value);
}

export function OrganizationsTable() {
  const me = useCurrentUser();
  const list = useListSearchParams({ pageSize: 25, sort: 'name', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const { kind, active } = list.filters;

  const query: OrganizationsQuery = {
    page: list.page,
    pageSize: list.pageSize,
    sort: list.sort || undefined,
    q: list.q || undefined,
    kind: isKind(kind) ? kind : undefined,
    active: active === 'true' ? true : active === 'false' ? false : undefined,
  };
  const organizations = useOrganizations({ query });

  const [pending, setPending] = useState<Organization | null>(null);
  const update = useUpdateOrganization({ onSuccess: () => setPending(null) });

  const columns = useMemo<GridColDef<Organization>[]>(
    () => [
      { field: 'name', headerName: 'Name', flex: 1.4, minWidth: 220 },
      {
        field: 'kind',
        headerName: 'Kind',
        width: 120,
        renderCell: ({ row }) => (
          <Chip
            size="small"
            label={KIND_LABELS[row.kind]}
            color={row.kind === 'lab' ? 'primary' : 'default'}
            variant="outlined"
            sx={{ height: 20, fontSize: '0.75rem' }}
          />
        ),
      },
      {
        field: 'contactEmail',
        headerName: 'Contact e-mail',
        flex: 1,
        minWidth: 200,
        sortable: false,
        valueFormatter: (value: string | null) => value ?? '—',
      },
      {
        field: 'active',
        headerName: 'Status',
        width: 120,
        sortable: false,
        renderCell: ({ row }) => <ActiveChip active={row.active} />,
      },
      {
        field: 'createdAt',
        headerName: 'Created',
        width: 120,
        renderCell: ({ row }) => <Num>{formatDate(row.createdAt)}</Num>,
      },
      {
        field: 'actions',
        ...unlabelledHeader('Actions'),
        width: 130,
        sortable: false,
        filterable: false,
        disableColumnMenu: true,
        align: 'right',
        renderCell: ({ row }) => {
          const own = row.id === me.organizationId;
          const button = (
            <Button
              size="small"
              color={row.active ? 'error' : 'primary'}
              disabled={own || (update.isPending && update.variables?.id === row.id)}
              onClick={() => (row.active ? setPending(row) : update.mutate({ id: row.id, changes: { active: true } }))}
              aria-label={`${row.active ? 'Deactivate' : 'Activate'} ${row.name}`}
            >
              {row.active ? 'Deactivate' : 'Activate'}
            </Button>
          );
          return own ? (
            <Tooltip title="You cannot deactivate your own organisation">
              <span>{button}</span>
            </Tooltip>
          ) : (
            button
          );
        },
      },
    ],
    // eslint-disable-next-line react-hooks/exhaustive-deps -- the mutation object is new on every render; the fields read are listed.
    [me.organizationId, update.isPending, update.variables, update.mutate],
  );

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Name or e-mail" value={list.q} onChange={(q) => list.update({ q })} />
        <SelectFilter label="Kind" value={kind} options={KIND_OPTIONS} onChange={(v) => list.update({ kind: v })} allLabel="All kinds" />
        <SelectFilter label="Status" value={active} options={STATUS_OPTIONS} onChange={(v) => list.update({ active: v })} />
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 230px)', minHeight: 360 }}>
        <ServerDataGrid label="Organisations" result={organizations} list={list} emptyText="No organisations match these filters." columns={columns} />
      </Paper>
      <ConfirmDialog
        open={pending !== null}
        title="Deactivate this organisation?"
        confirmLabel="Deactivate"
        destructive
        busy={update.isPending}
        onClose={() => setPending(null)}
        onConfirm={() => pending && update.mutate({ id: pending.id, changes: { active: false } })}
      >
        {pending && (
          <>
            <strong>{pending.name}</strong> will no longer be offered for new accounts or work. Its records, instruments and certificates are kept, and you can
            activate it again later.
          </>
        )}
      </ConfirmDialog>
    </>
  );
}
