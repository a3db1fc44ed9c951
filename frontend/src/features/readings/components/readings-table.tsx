import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { DataGrid, type GridColDef, type GridPaginationModel, type GridSortModel } from '@mui/x-data-grid';
import { useMemo, useState } from 'react';
import type { FrequencyUnit, Reading, RunDataKind } from '@kilocycle/common/types';
import { FormDialog, FormTextField, useZodForm } from '@/components/ui/form-dialog';
import { Num } from '@/components/ui/num';
import { usePhoneColumns, type PhoneLayout } from '@/components/ui/phone-columns';
import { toSortParam } from '@/lib/data-grid';
import { formatSeconds, valueHeading } from '@/utils/data-kind';
import { formatDateTime } from '@/utils/format';
import { formatDuration, formatHz, formatHzTo, formatNumber } from '@/utils/frequency';
import { formatCount } from '@/utils/measurement';
import { excludeReadingSchema, useExcludeReading } from '../api/exclude-reading';
import { useReadings } from '../api/get-readings';

const SOURCE_LABELS: Record<Reading['source'], string> = { manual: 'Typed', bridge: 'Bridge', import: 'Import' };

type ExcludeDialogProps = {
  runId: number;
  reading: Pick<Reading, 'id' | 'seq' | 'dial' | 'frequency'> | null;
  unit?: FrequencyUnit;
  /** A phase run's reading is a time interval in seconds, not a frequency. */
  dataKind?: RunDataKind;
  onClose: () => void;
  onExcluded?: (reading: Reading) => void;
};

/** Excludes one reading with a reason (the readings list's action; pages that flag readings open it too). */
export function ExcludeDialog({ runId, reading, unit, dataKind = 'frequency', onClose, onExcluded }: ExcludeDialogProps) {
  const form = useZodForm(excludeReadingSchema, { reason: '' });
  const exclude = useExcludeReading({
    onSuccess: (excluded) => {
      onExcluded?.(excluded);
      onClose();
    },
  });
  return (
    <FormDialog
      open={reading !== null}
      title={`Exclude reading ${reading ? `#${reading.seq}` : ''}?`}
      intro={
        reading && (
          <>
            {dataKind === 'phase' ? (
              <>
                Time interval <Num>{formatSeconds(reading.frequency)} s</Num>.
              </>
            ) : (
              <>
                Dial <Num>{reading.dial ?? '—'}</Num>, <Num>{formatHz(reading.frequency, unit)}</Num>.
              </>
            )}{' '}
            The reading stays on record, struck through with your reason, and leaves the fits. This cannot be undone.
          </>
        )
      }
      form={form}
      onSubmit={({ reason }) => reading && exclude.mutate({ runId, readingId: reading.id, reason })}
      onClose={onClose}
      onExited={() => exclude.reset()}
      pending={exclude.isPending}
      error={exclude.error}
      errorFallback="The reading could not be excluded."
      submitLabel="Exclude"
      pendingLabel="Excluding…"
      submitColor="error"
    >
      <FormTextField
        control={form.control}
        name="reason"
        label="Reason"
        required
        helperText="E.g. counter gate still counting, wrong dial setting, lead moved"
      />
    </FormDialog>
  );
}

type ReadingsTableProps = {
  runId: number;
  /** Unit frequencies are shown in (the range's dial unit); by size when absent. */
  unit?: FrequencyUnit;
  /** Resolution frequencies are shown to, Hz (0.1 Hz by default). */
  resolutionHz?: number;
  showDial?: boolean;
  showAux?: string | null;
  /** What the readings hold: the value column is Frequency, or Time interval (s) for a phase run. */
  dataKind?: RunDataKind;
  canExclude: boolean;
  onExcluded?: (reading: Reading) => void;
  height?: number;
};

/** Every reading of the run, newest first; an excluded one is struck through with its reason, never removed (in the secondary text colour, which keeps 4.5:1 contrast on a hovered row). */
export function ReadingsTable({
  runId,
  unit,
  resolutionHz = 0.1,
  showDial = true,
  showAux = null,
  dataKind = 'frequency',
  canExclude,
  onExcluded,
  height = 420,
}: ReadingsTableProps) {
  const [pagination, setPagination] = useState<GridPaginationModel>({ page: 0, pageSize: 50 });
  const [sortModel, setSortModel] = useState<GridSortModel>([{ field: 'seq', sort: 'desc' }]);
  const [excluding, setExcluding] = useState<Reading | null>(null);
  const readings = useReadings({
    runId,
    query: { page: pagination.page + 1, pageSize: pagination.pageSize, sort: toSortParam(sortModel) || 'seq' },
  });

  const columns = useMemo<GridColDef<Reading>[]>(() => {
    const struck = (row: Reading) => (row.excluded ? { textDecoration: 'line-through', color: 'text.secondary' } : undefined);
    return [
      // Up to seven digits: a bridge at ten readings a second reaches 1 000 000 in a day. Sequence numbers are names, not grouped.
      { field: 'seq', headerName: '#', width: 96, align: 'right', headerAlign: 'right', renderCell: ({ row }) => <Num sx={struck(row)}>{row.seq}</Num> },
      {
        field: 't',
        headerName: 'Time',
        width: 120,
        // Tenths of a second while it matters (a fast bridge), then minutes and hours. A calibration file
        // imported without a time column stores t = 0: the time is not known, so it says so.
        renderCell: ({ row }) =>
          showDial && row.source === 'import' && row.t === 0 ? (
            <Box component="span" title="The imported file gave no time" sx={{ color: 'text.secondary' }}>
              —
            </Box>
          ) : (
            <Num sx={struck(row)}>{row.t < 60 ? `${formatNumber(row.t, 1)} s` : formatDuration(row.t)}</Num>
          ),
      },
      ...(showDial
        ? [
            {
              field: 'dial',
              headerName: 'Dial',
              width: 100,
              align: 'right',
              headerAlign: 'right',
              renderCell: ({ row }) => <Num sx={struck(row)}>{row.dial === null ? '—' : formatNumber(row.dial, Number.isInteger(row.dial) ? 0 : 3)}</Num>,
            } satisfies GridColDef<Reading>,
          ]
        : []),
      {
        field: 'frequency',
        headerName: valueHeading(dataKind),
        width: 200,
        align: 'right',
        headerAlign: 'right',
        renderCell: ({ row }) => <Num sx={struck(row)}>{dataKind === 'phase' ? formatSeconds(row.frequency) : formatHzTo(row.frequency, resolutionHz)}</Num>,
      },
      ...(showAux
        ? [
            {
              field: 'aux',
              headerName: showAux,
              width: 100,
              sortable: false,
              align: 'right',
              headerAlign: 'right',
              renderCell: ({ row }) => <Num sx={struck(row)}>{row.aux ?? '—'}</Num>,
            } satisfies GridColDef<Reading>,
          ]
        : []),
      { field: 'source', headerName: 'Source', width: 80, sortable: false, valueFormatter: (v: Reading['source']) => SOURCE_LABELS[v] ?? v },
      {
        field: 'author',
        headerName: 'By',
        width: 140,
        sortable: false,
        valueGetter: (_v, row) => (row.author === null ? '' : row.author.kind === 'bench' ? `Bench ${row.author.name}` : row.author.name),
        renderCell: ({ row, value }) =>
          row.author === null ? (
            <Box component="span" sx={{ color: 'text.secondary' }}>
              —
            </Box>
          ) : (
            <span title={value}>{value}</span>
          ),
      },
      {
        field: 'receivedAt',
        headerName: 'Recorded',
        width: 160,
        sortable: false,
        renderCell: ({ row }) => <Num>{formatDateTime(row.receivedAt)}</Num>,
      },
      {
        field: 'excludedReason',
        headerName: 'Status',
        flex: 1,
        minWidth: 200,
        sortable: false,
        renderCell: ({ row }) =>
          row.excluded ? (
            <Box component="span" sx={{ color: 'error.main' }} title={row.excludedReason ?? ''}>
              Excluded: {row.excludedReason}
            </Box>
          ) : canExclude ? (
            <Button size="small" color="inherit" onClick={() => setExcluding(row)} aria-label={`Exclude reading ${row.seq}`} sx={{ color: 'text.secondary' }}>
              Exclude
            </Button>
          ) : (
            ''
          ),
      },
    ];
  }, [showDial, showAux, resolutionHz, dataKind, canExclude]);
  // On a phone the dial, the frequency and the exclusion stay; the sequence number, time and who entered it read
  // on a second line under the frequency.
  const phoneLayout = useMemo<PhoneLayout<Reading>>(
    () => ({
      keep: { ...(showDial ? { dial: 72 } : {}), frequency: 'fill', excludedReason: 84 },
      secondLine: (row) => [
        `#${row.seq}`,
        showDial && row.source === 'import' && row.t === 0 ? null : row.t < 60 ? `${formatNumber(row.t, 1)} s` : formatDuration(row.t),
        showAux && row.aux !== null && `${showAux} ${row.aux}`,
        SOURCE_LABELS[row.source],
        row.author && (row.author.kind === 'bench' ? `Bench ${row.author.name}` : row.author.name),
        row.excluded && `excluded: ${row.excludedReason ?? ''}`,
      ],
    }),
    [showDial, showAux],
  );
  const layout = usePhoneColumns(columns, phoneLayout);

  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'baseline', gap: 2, mb: 1 }}>
        <Typography variant="h3" component="h2">
          Readings
        </Typography>
        <Typography variant="body2" color="text.secondary" data-testid="readings-count">
          <Num>{formatCount(readings.data?.total ?? 0)}</Num> in this run
        </Typography>
      </Box>
      <Box sx={{ height }}>
        <DataGrid
          aria-label="Readings"
          rows={readings.data?.items ?? []}
          rowCount={readings.data?.total ?? 0}
          columns={layout.columns}
          columnVisibilityModel={layout.columnVisibilityModel}
          getRowHeight={layout.getRowHeight}
          loading={readings.isFetching && !readings.data}
          paginationMode="server"
          sortingMode="server"
          filterMode="server"
          disableColumnFilter
          paginationModel={pagination}
          onPaginationModelChange={setPagination}
          pageSizeOptions={[50, 100, 500]}
          sortModel={sortModel}
          onSortModelChange={(model) => setSortModel(model.length ? model : [{ field: 'seq', sort: 'desc' }])}
          sortingOrder={['desc', 'asc']}
          getRowClassName={({ row }) => (row.excluded ? 'kc-excluded' : '')}
          localeText={{ noRowsLabel: readings.isError ? 'The readings could not be loaded.' : 'No readings yet.' }}
          sx={[{ border: 0, '& .kc-excluded': { bgcolor: 'action.hover' } }, layout.sx]}
        />
      </Box>
      <ExcludeDialog runId={runId} reading={excluding} unit={unit} dataKind={dataKind} onClose={() => setExcluding(null)} onExcluded={onExcluded} />
    </Paper>
  );
}
