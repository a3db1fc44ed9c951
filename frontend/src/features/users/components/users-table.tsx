import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Tooltip from '@mui/material/Tooltip';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import { ROLES, type Organization, type Role, type User } from '@kilocycle/common/types';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { ActiveChip } from '@/components/ui/status-chip';
import { ROLE_LABELS } from '@/config/roles';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { useCurrentUser } from '@/lib/auth';
import { formatDate } from '@/utils/format';
import { useUsers, type UsersQuery } from '../api/get-users';
import { useUpdateUser } from '../api/update-user';

const FILTER_KEYS = ['role', 'organizationId', 'active'] as const;
// The fields the API sorts by; anything else typed into the address bar falls back to the default.
const SORT_FIELDS = ['name', 'email', 'role', 'organizationName', 'createdAt'];
const ROLE_OPTIONS = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));
const STATUS_OPTIONS = [
  { value: 'true', label: 'Active' },
  { value: 'false', label: 'Deactivated' },
];

function isRole(value: string): value is Role {
  return (ROLES as readonly string[]).includes(value);
}

type UsersTableProps = { organizations: readonly Organization[] };

export function UsersTable({ organizations }: UsersTableProps) {
  const me = useCurrentUser();
  const list = useListSearchParams({ pageSize: 25, sort: 'name', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const { role, organizationId, active } = list.filters;

  const query: UsersQuery = {
    page: list.page,
    pageSize: list.pageSize,
    sort: list.sort || undefined,
    q: list.q || undefined,
    role: isRole(role) ? role : undefined,
    organizationId: organizationId ? Number(organizationId) : undefined,
    active: active === 'true' ? true : active === 'false' ? false : undefined,
  };
  const users = useUsers({ query });

  const [pending, setPending] = useState<User | null>(null);
  const updateUser = useUpdateUser({ onSuccess: () => setPending(null) });

  const toggle = (user: User) => {
    // Re-activation is harmless; deactivation signs the person out at once, so it asks first.
    if (user.active) setPending(user);
    else updateUser.mutate({ id: user.id, changes: { active: true } });
  };

  const columns = useMemo<GridColDef<User>[]>(
    () => [
      { field: 'name', headerName: 'Name', flex: 1, minWidth: 140 },
      { field: 'email', headerName: 'E-mail', flex: 1.2, minWidth: 180 },
      {
        field: 'role',
        headerName: 'Role',
        width: 130,
        valueFormatter: (value: Role) => ROLE_LABELS[value] ?? value,
      },
      { field: 'organizationName', headerName: 'Organisation', flex: 1, minWidth: 160 },
      {
        field: 'active',
        headerName: 'Status',
        width: 110,
        sortable: false,
        renderCell: ({ row }) => <ActiveChip active={row.active} />,
      },
      {
        field: 'createdAt',
        headerName: 'Created',
        width: 110,
        renderCell: ({ row }) => <Num>{formatDate(row.createdAt)}</Num>,
      },
      {
        field: 'actions',
        ...unlabelledHeader('Actions'),
        width: 110,
        sortable: false,
        filterable: false,
        disableColumnMenu: true,
        align: 'right',
        renderCell: ({ row }) => {
          const self = row.id === me.id;
          const button = (
            <Button
              size="small"
              color={row.active ? 'error' : 'primary'}
              disabled={self || (updateUser.isPending && updateUser.variables?.id === row.id)}
              onClick={() => toggle(row)}
              aria-label={`${row.active ? 'Deactivate' : 'Activate'} ${row.name}`}
            >
              {row.active ? 'Deactivate' : 'Activate'}
            </Button>
          );
          return self ? (
            <Tooltip title="You cannot deactivate your own account">
              <span>{button}</span>
            </Tooltip>
          ) : (
            button
          );
        },
      },
    ],
    // eslint-disable-next-line react-hooks/exhaustive-deps -- toggle only uses stable setters and the mutation's stable mutate.
    [me.id, updateUser.isPending, updateUser.variables],
  );

  const organizationOptions = organizations.map((o) => ({ value: String(o.id), label: o.name }));

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Name or e-mail" value={list.q} onChange={(q) => list.update({ q })} />
        <SelectFilter label="Role" value={role} options={ROLE_OPTIONS} onChange={(v) => list.update({ role: v })} allLabel="All roles" />
        <SelectFilter
          label="Organisation"
          value={organizationId}
          options={organizationOptions}
          onChange={(v) => list.update({ organizationId: v })}
          allLabel="All organisations"
          minWidth={220}
        />
        <SelectFilter label="Status" value={active} options={STATUS_OPTIONS} onChange={(v) => list.update({ active: v })} />
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 230px)', minHeight: 360 }}>
        <ServerDataGrid label="Users" result={users} list={list} emptyText="No users match these filters." columns={columns} />
      </Paper>
      <ConfirmDialog
        open={pending !== null}
        title="Deactivate this account?"
        confirmLabel="Deactivate"
        destructive
        busy={updateUser.isPending}
        onClose={() => setPending(null)}
        onConfirm={() => pending && updateUser.mutate({ id: pending.id, changes: { active: false } })}
      >
        {pending && (
          <>
            <strong>{pending.name}</strong> ({pending.email}) will be signed out at once and can no longer sign in. Their records stay as they are, and you can
            activate the account again later.
          </>
        )}
      </ConfirmDialog>
    </>
  );
}
