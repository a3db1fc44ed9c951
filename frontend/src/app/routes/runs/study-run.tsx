import Box from '@mui/material/Box';
import { useMemo, useState } from 'react';
import type { FlaggedReading, Role, Run, RunAnalysis } from '@kilocycle/common/types';
import { useLatestReadings } from '@/features/readings/api/get-latest-readings';
import { useReadings, useRefreshReadings } from '@/features/readings/api/get-readings';
import { ReadingEntry } from '@/features/readings/components/reading-entry';
import { ExcludeDialog, ReadingsTable } from '@/features/readings/components/readings-table';
import { useLiveReadings } from '@/features/readings/hooks/use-live-readings';
import { useRunAnalysis } from '@/features/runs/api/get-run-analysis';
import { useRefreshRun, useThrottledRefreshRun } from '@/features/runs/api/use-refresh-run';
import { RunDataTransfer } from '@/features/imports/components/run-data-transfer';
import { RunHeader } from '@/features/runs/components/run-header';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { AuxView } from '@/features/studies/components/aux-view';
import { LiveStatus } from '@/features/studies/components/live-status';
import { DEFAULT_STABILITY_OPTIONS, StabilityView } from '@/features/studies/components/stability-view';
import { WarmupView } from '@/features/studies/components/warmup-view';
import { analysisProblem, mayWriteRun, noReadingsNotice, skipChartAnimation } from './run-access';

function pick<K extends RunAnalysis['analysis']>(data: RunAnalysis | undefined, kind: K): Extract<RunAnalysis, { analysis: K }> | null {
  return data && data.analysis === kind ? (data as Extract<RunAnalysis, { analysis: K }>) : null;
}

/**
 * Warm-up and stability runs: followed live while open, re-analysed at most twice a second as readings arrive. A
 * phase stability run (time intervals from a time-interval counter) also takes typed time intervals.
 */
export function TimeSeriesRun({ run, role }: { run: Run; role: Role }) {
  const canWrite = mayWriteRun(role, run.kind);
  const [stabilityOptions, setStabilityOptions] = useState(DEFAULT_STABILITY_OPTIONS);
  const [excluding, setExcluding] = useState<FlaggedReading | null>(null);
  const analysis = useRunAnalysis({ id: run.id, query: run.kind === 'stability' ? stabilityOptions : undefined });
  const latest = useLatestReadings({ runId: run.id });
  // The readings list below follows the stream too, at the same pace as the analysis.
  const refreshReadings = useRefreshReadings(run.id);
  const throttledRefresh = useThrottledRefreshRun(run.id, 500, refreshReadings);
  const refresh = useRefreshRun(run.id);
  const live = useLiveReadings(run.id, { enabled: run.status === 'open', onReadings: throttledRefresh });

  const tail = latest.data ?? [];
  const arrivedSince = tail.filter((r) => r.seq > run.lastSeq).length;
  const problem = analysisProblem(analysis.error);
  const empty = noReadingsNotice(analysis.data, analysis.error);
  const dataKind = run.dataKind ?? 'frequency';

  return (
    <>
      <RunHeader run={run} canWrite={canWrite} extra={<RunDataTransfer run={run} role={role} />} />
      {canWrite && run.status === 'open' && (
        <Box sx={{ mb: 2 }}>
          <SafetyCaution />
        </Box>
      )}
      <Box sx={{ mb: 2 }}>
        <LiveStatus
          state={run.status === 'open' ? live.state : 'closed'}
          message={run.status === 'open' ? live.message : null}
          readingCount={run.readingCount + arrivedSince}
          last={tail[tail.length - 1] ?? null}
          lastArrivalAt={live.lastArrivalAt}
          bridge={run.bridge}
          bridgeChange={live.bridge}
          dataKind={dataKind}
        />
      </Box>
      {dataKind === 'phase' && canWrite && run.status === 'open' && (
        <Box sx={{ mb: 2 }}>
          <ReadingEntry dataKind="phase" runId={run.id} refusal={run.refusal} onSaved={() => void refresh()} />
        </Box>
      )}
      {run.kind === 'warmup' ? (
        <WarmupView analysis={pick(analysis.data, 'warmup')} problem={problem} empty={empty} latest={tail} skipAnimation={skipChartAnimation} />
      ) : (
        <StabilityView
          analysis={pick(analysis.data, 'stability')}
          problem={problem}
          empty={empty}
          skipAnimation={skipChartAnimation}
          options={stabilityOptions}
          onOptionsChange={setStabilityOptions}
          onExclude={canWrite && !run.refusal ? setExcluding : undefined}
          fileTitle={`run-${run.id}`}
        />
      )}
      <ExcludeDialog
        runId={run.id}
        reading={excluding && { id: excluding.readingId, seq: excluding.seq, dial: null, frequency: excluding.frequency }}
        dataKind={dataKind}
        onClose={() => setExcluding(null)}
        onExcluded={() => void refresh()}
      />
      <Box sx={{ mt: 2 }}>
        <ReadingsTable
          runId={run.id}
          showDial={false}
          resolutionHz={run.kind === 'stability' ? 0.0001 : 0.01}
          dataKind={dataKind}
          canExclude={canWrite && !run.refusal}
          onExcluded={() => void refresh()}
          height={360}
        />
      </Box>
    </>
  );
}

/** Supply-sensitivity and keying runs: frequency against the auxiliary value, and the figure the analysis gives. */
export function AuxRun({ run, role }: { run: Run; role: Role }) {
  const canWrite = mayWriteRun(role, run.kind);
  const analysis = useRunAnalysis({ id: run.id });
  const refresh = useRefreshRun(run.id);
  const readings = useReadings({ runId: run.id, query: { excluded: false, pageSize: 500, sort: 'seq' } });
  const points = useMemo(
    () => (readings.data?.items ?? []).filter((r) => r.aux !== null).map((r) => ({ t: r.t, aux: r.aux as number, frequency: r.frequency })),
    [readings.data],
  );
  const kind = run.kind === 'keying' ? 'keying' : 'supply_sensitivity';
  const data = pick(analysis.data, kind);
  return (
    <>
      <RunHeader run={run} canWrite={canWrite} extra={<RunDataTransfer run={run} role={role} />} />
      {canWrite && run.status === 'open' && (
        <Box sx={{ mb: 2 }}>
          <SafetyCaution />
        </Box>
      )}
      <AuxView
        kind={kind}
        analysis={data}
        problem={analysisProblem(analysis.error)}
        empty={noReadingsNotice(analysis.data, analysis.error)}
        points={points}
        skipAnimation={skipChartAnimation}
      />
      <Box sx={{ mt: 2 }}>
        <ReadingsTable
          runId={run.id}
          showDial={false}
          showAux={run.kind === 'keying' ? 'Key' : 'Supply V'}
          canExclude={canWrite && !run.refusal}
          onExcluded={() => void refresh()}
        />
      </Box>
    </>
  );
}
