import CompareArrowsOutlined from '@mui/icons-material/CompareArrowsOutlined';
import SaveOutlined from '@mui/icons-material/SaveOutlined';
import Alert from '@mui/material/Alert';
import Autocomplete from '@mui/material/Autocomplete';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import CircularProgress from '@mui/material/CircularProgress';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import TextField from '@mui/material/TextField';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import { useMemo, useState } from 'react';
import {
  DEFAULT_COMPARISON_WINDOW_SECONDS,
  DEFAULT_COMPARISON_WITHIN_HZ,
  MAX_COMPARED_RUNS,
  MIN_COMPARED_RUNS,
  type ComparableRunKind,
  type ComputeComparisonRequest,
  type Instrument,
  type Run,
  type SavedComparison,
} from '@kilocycle/common/types';
import { HiddenLabel } from '@/components/ui/hidden-label';
import { numberSx } from '@/components/ui/num';
import { ApiError } from '@/lib/api-client';
import { formatDateTime } from '@/utils/format';
import { formatCount } from '@/utils/measurement';
import { useComputeComparison } from '../api/compute-comparison';
import { useComparableInstruments } from '../api/get-instruments';
import { useStudyRuns } from '../api/get-study-runs';
import { useSaveComparison } from '../api/save-comparison';
import { runColor } from '../utils/comparison-format';
import { ComparisonResultView } from './comparison-result';
import { SaveComparisonDialog } from './save-comparison-dialog';

type Chosen = { runId: number; label: string };

function instrumentName(i: Instrument) {
  return `${i.make} ${i.model}, ${i.serial} (${i.organizationName})`;
}

// Two runs read as before and after; more are numbered. The labels are only a start: people say what changed.
function defaultLabels(chosen: Chosen[]): Chosen[] {
  return chosen.map((c, i) => {
    if (c.label.trim() !== '' && !/^(before|after|run \d+)$/.test(c.label)) return c;
    const label = chosen.length === 2 ? (i === 0 ? 'before' : 'after') : `run ${c.runId}`;
    return { ...c, label };
  });
}

type ComparisonBuilderProps = {
  /** A saved comparison to change (its runs and labels); absent for a new one. */
  existing?: SavedComparison;
  canSave: boolean;
  onSaved: (saved: SavedComparison) => void;
};

/** Choose an instrument, two to six of its warm-up or stability runs, label each, and compare them. */
export function ComparisonBuilder({ existing, canSave, onSaved }: ComparisonBuilderProps) {
  const instruments = useComparableInstruments();
  const [instrumentId, setInstrumentId] = useState<number | null>(existing?.instrumentId ?? null);
  const [kind, setKind] = useState<ComparableRunKind>(existing?.kind ?? 'warmup');
  const [chosen, setChosen] = useState<Chosen[]>(existing ? existing.runIds.map((runId, i) => ({ runId, label: existing.labels[i] ?? '' })) : []);
  const [withinHz, setWithinHz] = useState(String(DEFAULT_COMPARISON_WITHIN_HZ));
  const [windowMinutes, setWindowMinutes] = useState(String(DEFAULT_COMPARISON_WINDOW_SECONDS / 60));
  const [saving, setSaving] = useState(false);
  const runs = useStudyRuns(instrumentId, kind);
  const compute = useComputeComparison();
  const save = useSaveComparison({
    onSuccess: (saved) => {
      setSaving(false);
      onSaved(saved);
    },
  });

  const runList = useMemo(() => runs.data?.items ?? [], [runs.data?.items]);
  const order = useMemo(() => new Map(runList.map((r, i) => [r.id, i])), [runList]);

  const request = (): ComputeComparisonRequest | null => {
    if (chosen.length < MIN_COMPARED_RUNS) return null;
    const within = Number(withinHz);
    const minutes = Number(windowMinutes);
    return {
      runIds: chosen.map((c) => c.runId),
      labels: chosen.map((c) => c.label.trim()),
      ...(Number.isFinite(within) && within > 0 ? { withinHz: within } : {}),
      ...(Number.isFinite(minutes) && minutes > 0 ? { windowSeconds: Math.round(minutes * 60) } : {}),
    };
  };
  const current = request();
  const stale = compute.data !== undefined && JSON.stringify(compute.variables) !== JSON.stringify(current);

  const toggle = (run: Run) => {
    setChosen((list) => {
      if (list.some((c) => c.runId === run.id)) return defaultLabels(list.filter((c) => c.runId !== run.id));
      if (list.length >= MAX_COMPARED_RUNS) return list;
      // The earliest run first: it is the reference the others are compared with.
      const next = [...list, { runId: run.id, label: '' }].sort((a, b) => (order.get(a.runId) ?? 0) - (order.get(b.runId) ?? 0));
      return defaultLabels(next);
    });
  };
  const setLabel = (runId: number, label: string) => setChosen((list) => list.map((c) => (c.runId === runId ? { ...c, label } : c)));

  const instrument = instruments.data?.items.find((i) => i.id === instrumentId) ?? null;
  const fileTitle = existing?.title ?? (instrument ? `${instrument.make} ${instrument.model} ${instrument.serial}` : 'comparison');
  const computeError = compute.error instanceof ApiError ? compute.error.messages : compute.error ? ['The comparison could not be computed.'] : [];

  return (
    <Box sx={{ display: 'grid', gap: 2 }}>
      <Paper variant="outlined" sx={{ p: 2 }}>
        <Box sx={{ display: 'flex', gap: 2, flexWrap: 'wrap', alignItems: 'center', mb: 2 }}>
          <Autocomplete
            options={instruments.data?.items ?? []}
            loading={instruments.isPending}
            value={instrument}
            getOptionLabel={instrumentName}
            isOptionEqualToValue={(a, b) => a.id === b.id}
            onChange={(_e, value) => {
              setInstrumentId(value?.id ?? null);
              setChosen([]);
              compute.reset();
            }}
            renderInput={(params) => <TextField {...params} label="Instrument" placeholder="Make, model or serial" />}
            sx={{ flex: '1 1 28rem', maxWidth: 640 }}
          />
          <ToggleButtonGroup
            exclusive
            size="small"
            value={kind}
            onChange={(_e, value: ComparableRunKind | null) => {
              if (!value) return;
              setKind(value);
              setChosen([]);
              compute.reset();
            }}
            aria-label="Kind of run"
          >
            <ToggleButton value="warmup">Warm-up runs</ToggleButton>
            <ToggleButton value="stability">Stability runs</ToggleButton>
          </ToggleButtonGroup>
        </Box>

        {instrumentId === null ? (
          <Typography color="text.secondary">Choose the instrument whose studies you want to compare.</Typography>
        ) : runs.isPending ? (
          <CircularProgress size={20} />
        ) : runList.length === 0 ? (
          <Typography color="text.secondary">This instrument has no {kind === 'warmup' ? 'warm-up' : 'stability'} runs.</Typography>
        ) : (
          <>
            <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
              Tick {MIN_COMPARED_RUNS} to {MAX_COMPARED_RUNS} runs and say what each one is. The earliest is the reference: the others are compared with it.
            </Typography>
            <Box sx={{ overflowX: 'auto' }}>
              <Table size="small" aria-label="Runs to compare" sx={{ '& td, & th': { py: 0.25, px: 1 } }}>
                <TableHead>
                  <TableRow>
                    <TableCell padding="checkbox">
                      <HiddenLabel>Compare</HiddenLabel>
                    </TableCell>
                    <TableCell>Run</TableCell>
                    <TableCell>Started</TableCell>
                    <TableCell>Set-up</TableCell>
                    <TableCell sx={{ textAlign: 'right' }}>Readings</TableCell>
                    <TableCell sx={{ minWidth: 280 }}>Label</TableCell>
                  </TableRow>
                </TableHead>
                <TableBody>
                  {runList.map((run) => {
                    const index = chosen.findIndex((c) => c.runId === run.id);
                    const selected = index >= 0;
                    return (
                      <TableRow key={run.id} selected={selected}>
                        <TableCell padding="checkbox">
                          <Checkbox
                            checked={selected}
                            onChange={() => toggle(run)}
                            disabled={!selected && chosen.length >= MAX_COMPARED_RUNS}
                            slotProps={{ input: { 'aria-label': `Compare run ${run.id}` } }}
                            sx={selected ? { color: runColor(index), '&.Mui-checked': { color: runColor(index) } } : undefined}
                          />
                        </TableCell>
                        <TableCell sx={numberSx}>
                          {run.id} · {run.jobNumber}
                          <Typography variant="caption" component="div" color="text.secondary">
                            {run.rangeLabel}
                          </Typography>
                        </TableCell>
                        <TableCell sx={numberSx}>{formatDateTime(run.startedAt)}</TableCell>
                        <TableCell>
                          <Typography variant="body2">{run.configuration ?? '—'}</Typography>
                          {run.notes && (
                            <Typography variant="caption" color="text.secondary">
                              {run.notes}
                            </Typography>
                          )}
                        </TableCell>
                        <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{formatCount(run.readingCount)}</TableCell>
                        <TableCell>
                          {selected && (
                            <TextField
                              size="small"
                              value={chosen[index]!.label}
                              onChange={(e) => setLabel(run.id, e.target.value)}
                              placeholder={`run ${run.id}`}
                              slotProps={{ htmlInput: { 'aria-label': `Label of run ${run.id}`, maxLength: 120 } }}
                            />
                          )}
                        </TableCell>
                      </TableRow>
                    );
                  })}
                </TableBody>
              </Table>
            </Box>
            <Box sx={{ display: 'flex', gap: 2, alignItems: 'center', flexWrap: 'wrap', mt: 2 }}>
              <TextField
                label="Settled within (Hz of f∞)"
                value={withinHz}
                onChange={(e) => setWithinHz(e.target.value)}
                inputMode="decimal"
                sx={{ width: 190 }}
              />
              <TextField
                label="Drift-rate window (min)"
                value={windowMinutes}
                onChange={(e) => setWindowMinutes(e.target.value)}
                inputMode="decimal"
                sx={{ width: 190 }}
              />
              <Box sx={{ flex: 1 }} />
              <Button
                variant="contained"
                startIcon={compute.isPending ? <CircularProgress size={16} color="inherit" /> : <CompareArrowsOutlined />}
                disabled={!current || compute.isPending}
                onClick={() => current && compute.mutate(current)}
              >
                {compute.data && !stale ? 'Compare again' : 'Compare'}
              </Button>
              {canSave && (
                <Button variant="outlined" startIcon={<SaveOutlined />} disabled={!compute.data || stale || save.isPending} onClick={() => setSaving(true)}>
                  {existing ? 'Save changes' : 'Save…'}
                </Button>
              )}
            </Box>
          </>
        )}
        {computeError.length > 0 && (
          <Alert severity="error" sx={{ mt: 2 }}>
            {computeError.join('; ')}
          </Alert>
        )}
      </Paper>

      {stale && (
        <Alert severity="info">The choice of runs, labels or settings has changed since this was computed: compare again to bring it up to date.</Alert>
      )}
      {compute.data && <ComparisonResultView result={compute.data} fileTitle={fileTitle} />}

      <SaveComparisonDialog
        key={saving ? 'open' : 'closed'}
        open={saving}
        heading={existing ? 'Save the changed comparison' : 'Save this comparison'}
        initialTitle={existing?.title ?? (instrument ? `${instrument.make} ${instrument.model}: ${chosen.map((c) => c.label).join(' vs ')}` : '')}
        initialNotes={existing?.notes ?? ''}
        busy={save.isPending}
        error={save.error}
        onClose={() => {
          setSaving(false);
          save.reset();
        }}
        onSave={({ title, notes }) => {
          if (!current) return;
          if (existing) save.mutate({ id: existing.id, body: { ...current, title, notes } });
          else save.mutate({ id: null, body: { ...current, title, notes } });
        }}
      />
    </Box>
  );
}
