import AttachFileOutlined from '@mui/icons-material/AttachFileOutlined';
import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import type { MailMessageSummary } from '@kilocycle/common/types';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { formatDateTime } from '@/utils/format';
import { formatBytes } from '@/utils/measurement';
import { useMail } from '../api/get-mail';
import { MAIL_KIND_LABELS, mailKindLabel } from '../utils/mail-kinds';

const SORT_FIELDS = ['receivedAt', 'subject', 'kind', 'size', 'id'];
const FILTER_KEYS = ['kind'] as const;
const KIND_OPTIONS = Object.entries(MAIL_KIND_LABELS).map(([value, label]) => ({ value, label }));

/** Every message the app has sent, as the mail server it talks to captured it; newest first. */
export function OutboxTable({ messagePath }: { messagePath: (id: number) => string }) {
  const list = useListSearchParams({ pageSize: 25, sort: '-receivedAt', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const mail = useMail({
    query: { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, q: list.q || undefined, kind: list.filters.kind || undefined },
  });

  const columns = useMemo<GridColDef<MailMessageSummary>[]>(
    () => [
      { field: 'receivedAt', headerName: 'Sent', width: 150, renderCell: ({ row }) => <Num>{formatDateTime(row.receivedAt)}</Num> },
      { field: 'kind', headerName: 'Kind', width: 150, valueFormatter: (value: string) => mailKindLabel(value) },
      {
        field: 'subject',
        headerName: 'Subject',
        flex: 1.6,
        minWidth: 260,
        renderCell: ({ row }) => (
          <Link component={RouterLink} to={messagePath(row.id)}>
            {row.subject || '(no subject)'}
          </Link>
        ),
      },
      { field: 'to', headerName: 'To', flex: 1, minWidth: 200, sortable: false, valueFormatter: (value: string[]) => value.join(', ') },
      {
        field: 'attachmentCount',
        ...unlabelledHeader('Attachments'),
        width: 56,
        sortable: false,
        renderCell: ({ row }) =>
          row.attachmentCount > 0 ? (
            <Box sx={{ display: 'flex', alignItems: 'center', color: 'text.secondary' }} aria-label={`${row.attachmentCount} attachments`}>
              <AttachFileOutlined fontSize="small" />
              {row.attachmentCount > 1 && <Num>{row.attachmentCount}</Num>}
            </Box>
          ) : null,
      },
      { field: 'size', headerName: 'Size', width: 90, align: 'right', headerAlign: 'right', renderCell: ({ row }) => <Num>{formatBytes(row.size)}</Num> },
    ],
    [messagePath],
  );

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Subject, sender or recipient" value={list.q} onChange={(q) => list.update({ q })} />
        <SelectFilter label="Kind" value={list.filters.kind} options={KIND_OPTIONS} onChange={(kind) => list.update({ kind })} allLabel="All kinds" />
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 240px)', minHeight: 320 }}>
        <ServerDataGrid
          label="Outbox"
          result={mail}
          list={list}
          emptyText="No mail has been sent yet."
          errorText="The outbox could not be loaded."
          columns={columns}
        />
      </Paper>
    </>
  );
}
