import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import type { GridColDef } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import { formatMoney } from '@kilocycle/common/money';
import { QUOTE_STATUSES, type ListQuotesQuery, type Quote } from '@kilocycle/common/types';
import { Money } from '@/components/billing/money';
import { PdfButton } from '@/components/billing/pdf-button';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { serverMessages } from '@/components/ui/form-dialog';
import { FormErrors } from '@/components/ui/form-errors';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { SelectFilter } from '@/components/ui/select-filter';
import { ServerDataGrid } from '@/components/ui/server-data-grid';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { notify } from '@/lib/notifications';
import { formatDate } from '@/utils/format';
import { useAcceptQuote } from '../api/accept-quote';
import { downloadQuotePdf } from '../api/download-quote-pdf';
import { useQuotes } from '../api/get-quotes';
import { DeclineQuoteDialog } from './decline-quote-dialog';
import { QUOTE_STATUS_LABELS, QuoteStatusChip } from './quote-status-chip';

const SORT_FIELDS = ['number', 'status', 'sentAt', 'validUntil'];
const FILTER_KEYS = ['status'] as const;
// A client never sees a draft.
const STATUS_OPTIONS = QUOTE_STATUSES.filter((s) => s !== 'draft').map((s) => ({ value: s, label: QUOTE_STATUS_LABELS[s] }));

/** A client's quotes from the lab: the PDF, and Accept or Decline while one awaits an answer. */
export function PortalQuotes() {
  const list = useListSearchParams({ pageSize: 25, sort: '-sentAt', sortFields: SORT_FIELDS }, FILTER_KEYS);
  const status = STATUS_OPTIONS.find((o) => o.value === list.filters.status)?.value;
  const query: ListQuotesQuery = { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, status };
  const quotes = useQuotes({ query });
  const [accepting, setAccepting] = useState<Quote | null>(null);
  const [declining, setDeclining] = useState<Quote | null>(null);
  const accept = useAcceptQuote({
    onSuccess: (q) => {
      setAccepting(null);
      notify('success', `Thank you: quote ${q.number} is accepted, and the lab can start work.`);
    },
  });

  const columns = useMemo<GridColDef<Quote>[]>(
    () => [
      { field: 'number', headerName: 'Quote', width: 120, renderCell: ({ row }) => <Num>{row.number}</Num> },
      { field: 'jobNumber', headerName: 'Job', width: 120, sortable: false, renderCell: ({ row }) => <Num>{row.jobNumber}</Num> },
      { field: 'status', headerName: 'Status', width: 210, renderCell: ({ row }) => <QuoteStatusChip quote={row} /> },
      { field: 'sentAt', headerName: 'Sent', width: 110, renderCell: ({ row }) => <Num>{formatDate(row.sentAt)}</Num> },
      {
        field: 'total',
        headerName: 'Total',
        width: 130,
        sortable: false,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Money minor={row.totals.grossMinor} currency={row.currency} />,
      },
      {
        field: 'actions',
        ...unlabelledHeader<Quote>('Actions'),
        flex: 1,
        minWidth: 230,
        sortable: false,
        disableColumnMenu: true,
        align: 'right',
        renderCell: ({ row }) => (
          <Box sx={{ display: 'flex', alignItems: 'center', gap: 0.5, justifyContent: 'flex-end', flexWrap: 'wrap' }}>
            <PdfButton download={() => downloadQuotePdf(row)} ariaLabel={`Download quote ${row.number} as PDF`} />
            {row.status === 'sent' && (
              <>
                <Button size="small" variant="contained" aria-label={`Accept quote ${row.number}`} onClick={() => setAccepting(row)}>
                  Accept
                </Button>
                <Button size="small" color="error" aria-label={`Decline quote ${row.number}`} onClick={() => setDeclining(row)}>
                  Decline
                </Button>
              </>
            )}
          </Box>
        ),
      },
    ],
    [],
  );
  const phoneLayout = useMemo<PhoneLayout<Quote>>(
    () => ({
      keep: { number: 'fill', actions: 200 },
      secondLine: (row) => [
        `job ${row.jobNumber}`,
        QUOTE_STATUS_LABELS[row.status].toLowerCase(),
        row.validUntil && row.status === 'sent' && `valid until ${formatDate(row.validUntil)}`,
        formatMoney(row.totals.grossMinor, row.currency),
      ],
    }),
    [],
  );
  const layout = usePhoneColumns(columns, phoneLayout);

  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap' }}>
        <SelectFilter label="Status" value={list.filters.status} options={STATUS_OPTIONS} onChange={(v) => list.update({ status: v })} allLabel="Any status" />
      </Box>
      <Paper variant="outlined" sx={{ height: 'calc(100vh - 260px)', minHeight: 320 }}>
        <ServerDataGrid
          label="Quotes"
          result={quotes}
          list={list}
          emptyText="No quotes from the lab yet."
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          sx={layout.sx}
        />
      </Paper>
      <ConfirmDialog
        open={accepting !== null}
        title={accepting ? `Accept quote ${accepting.number}?` : 'Accept the quote?'}
        confirmLabel={accept.isPending ? 'Accepting…' : 'Accept'}
        busy={accept.isPending}
        onClose={() => {
          setAccepting(null);
          accept.reset();
        }}
        onConfirm={() => accepting && accept.mutate({ id: accepting.id })}
      >
        {accepting && (
          <>
            You agree to the work on job <Num>{accepting.jobNumber}</Num> for a total of{' '}
            <Money minor={accepting.totals.grossMinor} currency={accepting.currency} />, as the quote sets out. The lab can then start.
            <Box sx={{ mt: 1 }}>
              <FormErrors messages={serverMessages(accept.error, 'The quote could not be accepted.')} />
            </Box>
          </>
        )}
      </ConfirmDialog>
      <DeclineQuoteDialog quote={declining} byCustomer onClose={() => setDeclining(null)} />
    </>
  );
}
