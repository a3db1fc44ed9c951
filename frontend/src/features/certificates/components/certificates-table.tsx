import MoreVertOutlined from '@mui/icons-material/MoreVertOutlined';
import Box from '@mui/material/Box';
import IconButton from '@mui/material/IconButton';
import Link from '@mui/material/Link';
import Menu from '@mui/material/Menu';
import MenuItem from '@mui/material/MenuItem';
import Paper from '@mui/material/Paper';
import Tooltip from '@mui/material/Tooltip';
import { DataGrid, type GridColDef, type GridPaginationModel, type GridSortModel } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import { Link as RouterLink } from 'react-router-dom';
import { CERTIFICATE_STATUSES, type Certificate, type ListCertificatesQuery } from '@kilocycle/common/types';
import { CERTIFICATE_STATUS_LABELS, CertificateStatusChip } from '@/components/ui/certificate-status-chip';
import { DECISION_LABELS, DecisionChip } from '@/components/ui/decision-chip';
import { unlabelledHeader } from '@/components/ui/hidden-label';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { SearchField } from '@/components/ui/search-field';
import { SelectFilter } from '@/components/ui/select-filter';
import { useListSearchParams } from '@/hooks/use-list-search-params';
import { useCurrentUser } from '@/lib/auth';
import { fromPaginationModel, fromSortParam, PAGE_SIZE_OPTIONS, toPaginationModel, toSortParam } from '@/lib/data-grid';
import { formatDate } from '@/utils/format';
import { useCertificates } from '../api/get-certificates';
import { CertificateActions } from './certificate-actions';
import { DownloadCertificateButton } from './download-certificate-button';
import { HeldCertificate, isHeld, type PayInvoiceSlot } from './held-certificate';

const SORT_FIELDS = ['number', 'revision', 'status', 'issuedAt', 'organizationName'];
const FILTER_KEYS = ['status'] as const;

type Shape = {
  query: ListCertificatesQuery;
  paginationModel: GridPaginationModel;
  sortModel: GridSortModel;
  onPagination: (model: GridPaginationModel) => void;
  onSort: (model: GridSortModel) => void;
};

type CertificatesTableProps = {
  /** Embedded on another page: paging kept locally instead of in the address bar, no filters. */
  embedded?: boolean;
  verifyPath: (number: string) => string;
  jobPath?: (jobId: number) => string;
  height?: number | string;
  /** For a client: the button that pays the invoice holding a certificate back (the invoices feature's, composed by the route). */
  payInvoice?: PayInvoiceSlot;
};

function useUrlShape(): Shape & { q: string; status: string; update: ReturnType<typeof useListSearchParams>['update'] } {
  const list = useListSearchParams({ pageSize: 25, sort: '-issuedAt', sortFields: SORT_FIELDS }, FILTER_KEYS);
  return {
    query: { page: list.page, pageSize: list.pageSize, sort: list.sort || undefined, q: list.q || undefined, status: list.filters.status || undefined },
    paginationModel: toPaginationModel(list.page, list.pageSize),
    sortModel: fromSortParam(list.sort),
    onPagination: (model) => list.update(fromPaginationModel(model)),
    onSort: (model) => list.update({ sort: toSortParam(model) }),
    q: list.q,
    status: list.filters.status,
    update: list.update,
  };
}

function useLocalShape(): Shape {
  const [page, setPage] = useState({ page: 1, pageSize: 10 });
  const [sort, setSort] = useState('-issuedAt');
  return {
    query: { ...page, sort },
    paginationModel: toPaginationModel(page.page, page.pageSize),
    sortModel: fromSortParam(sort),
    onPagination: (model) => setPage(fromPaginationModel(model)),
    onSort: (model) => setSort(toSortParam(model) || '-issuedAt'),
  };
}

function Table({ shape, embedded, verifyPath, jobPath, height, payInvoice }: { shape: Shape } & CertificatesTableProps) {
  const user = useCurrentUser();
  const isClient = user.role === 'client';
  const isLead = user.role === 'lead';
  const certificates = useCertificates({ query: shape.query });
  const [menu, setMenu] = useState<{ anchor: HTMLElement; certificate: Certificate } | null>(null);
  const [pending, setPending] = useState<{ certificate: Certificate; action: 'amend' | 'withdraw' } | null>(null);

  const columns = useMemo<GridColDef<Certificate>[]>(
    () => [
      {
        field: 'number',
        headerName: 'Certificate',
        width: 130,
        // describeChild: the tooltip describes the link, whose name stays the number it shows.
        renderCell: ({ row }) => (
          <Tooltip title="Public verification page" describeChild>
            <Link component={RouterLink} to={verifyPath(row.number)}>
              <Num>{row.number}</Num>
            </Link>
          </Tooltip>
        ),
      },
      { field: 'revision', headerName: 'Rev.', width: 64, align: 'right', headerAlign: 'right' },
      {
        field: 'status',
        headerName: 'Status',
        width: 108,
        renderCell: ({ row }) => (
          <Tooltip title={row.withdrawnReason ?? row.amendmentReason ?? (row.signedByName ? `Signed by ${row.signedByName}` : '')}>
            <span>
              <CertificateStatusChip status={row.status} />
            </span>
          </Tooltip>
        ),
      },
      // Both outcomes: an as-found failure shows in the list even when the instrument left within tolerance.
      {
        field: 'asFoundDecision',
        headerName: 'As found',
        width: 108,
        sortable: false,
        renderCell: ({ row }) =>
          row.status === 'draft' ? (
            '—'
          ) : (
            <Tooltip title="Before adjustment: the worst as-found decision">
              <span>
                <DecisionChip decision={row.asFoundDecision} />
              </span>
            </Tooltip>
          ),
      },
      {
        field: 'decision',
        headerName: 'Final',
        width: 108,
        sortable: false,
        renderCell: ({ row }) =>
          row.status === 'draft' ? (
            '—'
          ) : (
            <Tooltip title="As left, after adjustment (as found where no adjustment was made): the decision the certificate states">
              <span>
                <DecisionChip decision={row.decision} />
              </span>
            </Tooltip>
          ),
      },
      { field: 'instrumentLabel', headerName: 'Instrument', flex: 1.4, minWidth: 150, sortable: false },
      ...(isClient ? [] : [{ field: 'organizationName', headerName: 'Customer', flex: 1, minWidth: 110 } satisfies GridColDef<Certificate>]),
      {
        field: 'jobNumber',
        headerName: 'Job',
        width: 110,
        sortable: false,
        renderCell: ({ row }) =>
          jobPath && !isClient ? (
            <Link component={RouterLink} to={jobPath(row.jobId)}>
              <Num>{row.jobNumber}</Num>
            </Link>
          ) : (
            <Num>{row.jobNumber}</Num>
          ),
      },
      { field: 'issuedAt', headerName: 'Issued', width: 110, renderCell: ({ row }) => <Num>{formatDate(row.issuedAt)}</Num> },
      {
        field: 'actions',
        ...unlabelledHeader('Actions'),
        width: isLead ? 120 : 90,
        sortable: false,
        disableColumnMenu: true,
        align: 'right',
        renderCell: ({ row }) => (
          <Box sx={{ display: 'flex', alignItems: 'center' }}>
            <DownloadCertificateButton certificate={row} />
            {isLead && row.status === 'issued' && (
              <IconButton
                size="small"
                aria-label={`More for ${row.number} revision ${row.revision}`}
                onClick={(e) => setMenu({ anchor: e.currentTarget, certificate: row })}
              >
                <MoreVertOutlined fontSize="small" />
              </IconButton>
            )}
          </Box>
        ),
      },
    ],
    [isClient, isLead, verifyPath, jobPath],
  );
  // On a phone the number, status, final decision and PDF stay in view; the as-found outcome and the rest read
  // on a second line under the number.
  const phoneLayout = useMemo<PhoneLayout<Certificate>>(
    () => ({
      keep: { number: 'fill', status: 80, decision: 68, actions: isLead ? 90 : 60 },
      secondLine: (row) => [
        `Rev. ${row.revision}`,
        row.status !== 'draft' && `as found: ${row.asFoundDecision ? DECISION_LABELS[row.asFoundDecision].toLowerCase() : 'not decided'}`,
        row.instrumentLabel,
        !isClient && row.organizationName,
        `job ${row.jobNumber}`,
        row.issuedAt && `issued ${formatDate(row.issuedAt)}`,
      ],
    }),
    [isClient, isLead],
  );
  const layout = usePhoneColumns(columns, phoneLayout);
  const held = (certificates.data?.items ?? []).filter((c) => c.status === 'issued' && isHeld(c.release));

  return (
    <>
      {held.length > 0 && (
        <Box sx={{ display: 'grid', gap: 1, mb: 1.5 }}>
          {held.map((c) => c.release && <HeldCertificate key={c.id} number={c.number} release={c.release} payInvoice={payInvoice} />)}
        </Box>
      )}
      <Paper
        variant="outlined"
        // Embedded, the grid is as tall as its rows (a customer has a handful of certificates; two lines each on a
        // phone); on its own page it fills the screen.
        sx={{
          height:
            height ?? (embedded ? Math.min(Math.max(certificates.data?.items.length ?? 1, 1), 10) * (layout.phone ? 200 : 36) + 100 : 'calc(100vh - 240px)'),
          minHeight: embedded ? 0 : 300,
        }}
      >
        <DataGrid
          aria-label="Certificates"
          rows={certificates.data?.items ?? []}
          rowCount={certificates.data?.total ?? 0}
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          loading={certificates.isFetching}
          paginationMode="server"
          sortingMode="server"
          filterMode="server"
          disableColumnFilter
          paginationModel={shape.paginationModel}
          onPaginationModelChange={shape.onPagination}
          pageSizeOptions={embedded ? [10, 25] : PAGE_SIZE_OPTIONS}
          sortModel={shape.sortModel}
          onSortModelChange={shape.onSort}
          sortingOrder={['asc', 'desc']}
          localeText={{ noRowsLabel: certificates.isError ? 'The certificates could not be loaded.' : 'No certificates yet.' }}
          sx={[{ border: 0 }, layout.sx]}
        />
      </Paper>
      <Menu anchorEl={menu?.anchor} open={menu !== null} onClose={() => setMenu(null)}>
        <MenuItem
          onClick={() => {
            if (menu) setPending({ certificate: menu.certificate, action: 'amend' });
            setMenu(null);
          }}
        >
          Amend (new revision)…
        </MenuItem>
        <MenuItem
          sx={{ color: 'error.main' }}
          onClick={() => {
            if (menu) setPending({ certificate: menu.certificate, action: 'withdraw' });
            setMenu(null);
          }}
        >
          Withdraw…
        </MenuItem>
      </Menu>
      <CertificateActions certificate={pending?.certificate ?? null} action={pending?.action ?? null} onClose={() => setPending(null)} />
    </>
  );
}

const STATUS_OPTIONS = CERTIFICATE_STATUSES.map((status) => ({ value: status, label: CERTIFICATE_STATUS_LABELS[status] }));

function PageTable(props: CertificatesTableProps) {
  const shape = useUrlShape();
  const user = useCurrentUser();
  const options = user.role === 'client' ? STATUS_OPTIONS.filter((o) => o.value !== 'draft') : STATUS_OPTIONS;
  return (
    <>
      <Box sx={{ display: 'flex', gap: 1.5, mb: 1.5, flexWrap: 'wrap', alignItems: 'center' }}>
        <SearchField label="Search" placeholder="Number, instrument or customer" value={shape.q} onChange={(q) => shape.update({ q })} />
        <SelectFilter label="Status" value={shape.status} options={options} onChange={(status) => shape.update({ status })} allLabel="All statuses" />
      </Box>
      <Table shape={shape} {...props} />
    </>
  );
}

function EmbeddedTable(props: CertificatesTableProps) {
  const shape = useLocalShape();
  return <Table shape={shape} {...props} />;
}

/** Certificates with their status, revision and PDF; the lead amends or withdraws from here. */
export function CertificatesTable(props: CertificatesTableProps) {
  return props.embedded ? <EmbeddedTable {...props} /> : <PageTable {...props} />;
}
