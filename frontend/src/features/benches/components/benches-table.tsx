import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import type { Bench } from '@kilocycle/common/types';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { SearchField } from '@/components/ui/search-field';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDateTime } from '@/utils/format';
import { useBenches } from '../api/get-benches';
import { useIssueBenchToken } from '../api/issue-bench-token';
import { useRevokeBenchToken } from '../api/revoke-bench-token';
import { BenchTokenDialog } from './bench-token-dialog';

const SORT_FIELDS = ['name', 'location', 'active'];

/** The lab's measurement stations; an administrator issues and revokes their bridge tokens. */
export function BenchesTable({ isAdmin }: { isAdmin: boolean }) {
  const list = useListSearchParams({ pageSize: 25, sort: 'name', sortFields: SORT_FIELDS });
  const benches = useBenches({ query: { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, q: list.q || undefined } });
  const [issued, setIssued] = useState<{ bench: Bench; token: string } | null>(null);
  const [confirm, setConfirm] = useState<{ bench: Bench; action: 'issue' | 'revoke' } | null>(null);
  const issue = useIssueBenchToken();
  const revoke = useRevokeBenchToken({ onSuccess: () => setConfirm(null) });

  const doIssue = (bench: Bench) =>
    issue.mutate(bench.id, {
      onSuccess: ({ token }) => {
        setConfirm(null);
        setIssued({ bench, token });
      },
    });

  const columns = useMemo<GridColDef<Bench>[]>(
    () => [
      { field: 'name', headerName: 'Bench', flex: 1, minWidth: 150 },
      { field: 'location', headerName: 'Location', flex: 1, minWidth: 150, valueFormatter: (v: string | null) => v ?? '—' },
      { field: 'defaultStandardName', headerName: 'Default standard', flex: 1, minWidth: 160, sortable: false, valueFormatter: (v: string | null) => v ?? '—' },
      {
        field: 'hasToken',
        headerName: 'Bridge token',
        width: 220,
        sortable: false,
        renderCell: ({ row }) =>
          row.hasToken ? (
            <span>
              Issued <Num>{formatDateTime(row.tokenIssuedAt)}</Num>
            </span>
          ) : (
            'None'
          ),
      },
      {
        field: 'active',
        headerName: 'Status',
        width: 110,
        renderCell: ({ row }) => (
          <Chip
            size="small"
            variant="outlined"
            color={row.active ? 'success' : 'default'}
            label={row.active ? 'In use' : 'Out of use'}
            sx={{ height: 20, fontSize: '0.75rem' }}
          />
        ),
      },
      ...(isAdmin
        ? [
            {
              field: 'actions',
              ...unlabelledHeader('Actions'),
              width: 260,
              sortable: false,
              disableColumnMenu: true,
              align: 'right',
              renderCell: ({ row }) => (
                <Box sx={{ display: 'flex', gap: 0.5, justifyContent: 'flex-end', alignItems: 'center', height: '100%' }}>
                  <Button
                    size="small"
                    variant="outlined"
                    disabled={!row.active}
                    aria-label={`Issue bridge token for ${row.name}`}
                    onClick={() => (row.hasToken ? setConfirm({ bench: row, action: 'issue' }) : doIssue(row))}
                  >
                    Issue bridge token
                  </Button>
                  {row.hasToken && (
                    <Button
                      size="small"
                      color="error"
                      aria-label={`Revoke the token of ${row.name}`}
                      onClick={() => setConfirm({ bench: row, action: 'revoke' })}
                    >
                      Revoke
                    </Button>
                  )}
                </Box>
              ),
            } satisfies GridColDef<Bench>,
          ]
        : []),
    ],
    // eslint-disable-next-line react-hooks/exhaustive-deps -- doIssue only uses the stable mutate and setters.
    [isAdmin],
  );

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap' }}>
        <SearchField label="Search" placeholder="Bench name or location" value={list.q} onChange={(q) => list.update({ q })} />
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 230px)', minHeight: 320 }}>
        <ServerDataGrid label="Benches" result={benches} list={list} emptyText="No benches yet." columns={columns} />
      </Paper>
      <ConfirmDialog
        open={confirm !== null}
        title={confirm?.action === 'revoke' ? 'Revoke this bridge token?' : 'Issue a new bridge token?'}
        confirmLabel={confirm?.action === 'revoke' ? 'Revoke' : 'Issue new token'}
        destructive
        busy={issue.isPending || revoke.isPending}
        onClose={() => setConfirm(null)}
        onConfirm={() => {
          if (!confirm) return;
          if (confirm.action === 'revoke') revoke.mutate(confirm.bench.id);
          else doIssue(confirm.bench);
        }}
      >
        {confirm && (
          <>
            {confirm.action === 'issue' ? (
              <>
                <strong>{confirm.bench.name}</strong> already has a token. A new one replaces it: a bridge running with the old token is cut off at once and
                refused until it is started again with the new one. Readings it still holds stay in its spool file and are sent once it runs again.
              </>
            ) : (
              <>
                The bridge on <strong>{confirm.bench.name}</strong> is cut off at once and refused from then on. Readings it still holds stay in its spool file.
              </>
            )}
          </>
        )}
      </ConfirmDialog>
      <BenchTokenDialog benchName={issued?.bench.name ?? ''} token={issued?.token ?? null} onClose={() => setIssued(null)} />
    </>
  );
}
