import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import { useCallback, useState } from 'react';
import type { CalibrationRunAnalysis, Reading, Role, Run } from '@kilocycle/common/types';
import { useInstrument } from '@/features/instruments/api/get-instrument';
import { useCaptureState } from '@/features/readings/api/counter-capture';
import { ReadingEntry } from '@/features/readings/components/reading-entry';
import { useRefreshReadings } from '@/features/readings/api/get-readings';
import { ReadingsTable } from '@/features/readings/components/readings-table';
import { createCaptureFeed } from '@/features/readings/hooks/capture-feed';
import { useLiveReadings } from '@/features/readings/hooks/use-live-readings';
import { useRunAnalysis } from '@/features/runs/api/get-run-analysis';
import { useRefreshRun, useThrottledRefreshRun } from '@/features/runs/api/use-refresh-run';
import { AlignmentPanel } from '@/features/runs/components/calibration/alignment-panel';
import { CorrectionTable } from '@/features/runs/components/calibration/correction-table';
import { ErrorChart } from '@/features/runs/components/calibration/error-chart';
import { FitSummary } from '@/features/runs/components/calibration/fit-summary';
import { PaddingCalculator } from '@/features/runs/components/calibration/padding-calculator';
import { RunDataTransfer } from '@/features/imports/components/run-data-transfer';
import { BridgeChip } from '@/components/ui/bridge-chip';
import { RunHeader } from '@/features/runs/components/run-header';
import { SafetyCaution } from '@/components/ui/safety-caution';
import { analysisProblem, mayWriteRun, noReadingsNotice, skipChartAnimation } from './run-access';

/** The bench page of an as-found or as-left run: typed readings on the left, the fit updating beside them. */
export function CalibrationRun({ run, role }: { run: Run; role: Role }) {
  const analysis = useRunAnalysis({ id: run.id });
  const refresh = useRefreshRun(run.id);
  // A run on a bench may also be fed by its bridge (a dial sweep): follow it live like a study.
  const refreshReadings = useRefreshReadings(run.id);
  const throttledRefresh = useThrottledRefreshRun(run.id, 500, refreshReadings);
  // Counter-assisted capture: the setting waiting for the counter as pushed live, for the entry form alone.
  const [captureFeed] = useState(createCaptureFeed);
  // Counter readings (no dial) feed a waiting setting, not the fit: only readings at a setting refresh the page, so the
  // stream of counter readings does not keep the browser busy while the setting settles.
  const onReadings = useCallback(
    (readings: Reading[]) => {
      if (readings.some((r) => r.dial !== null)) throttledRefresh();
    },
    [throttledRefresh],
  );
  // Followed live whenever the run is open, bench or not: readings typed and exclusions made on another screen show at once.
  const live = useLiveReadings(run.id, { enabled: run.status === 'open', onReadings, onCapture: captureFeed.push });
  const canWrite = mayWriteRun(role, run.kind);
  const captureState = useCaptureState({ runId: run.id, enabled: canWrite && run.benchId !== null && run.status === 'open' });
  const bridgeLive = live.bridge ? live.bridge.connected : run.bridge.connected;
  const data = analysis.data?.analysis === 'calibration' ? (analysis.data as CalibrationRunAnalysis) : null;
  const problem = analysisProblem(analysis.error);
  const empty = noReadingsNotice(analysis.data, analysis.error);
  // The range as the instrument defines it, so the entry form knows its units before the first reading.
  const instrument = useInstrument({ id: run.instrumentId });
  const range = instrument.data?.ranges.find((r) => r.id === run.rangeId) ?? data?.range ?? null;
  const unit = !range || range.dialUnit === 'div' ? undefined : range.dialUnit;

  return (
    <>
      <RunHeader run={run} canWrite={canWrite} extra={<RunDataTransfer run={run} role={role} />} />
      {run.status === 'open' && (run.bridge.since !== null || live.bridge) && (
        <Box sx={{ mb: 2 }}>
          <BridgeChip bridge={run.bridge} change={live.bridge} lastArrivalAt={live.lastArrivalAt} />
        </Box>
      )}
      {canWrite && (
        <Box sx={{ mb: 2 }}>
          <SafetyCaution />
        </Box>
      )}
      {/* Every track is minmax(0, …): a wide table inside scrolls in its own box instead of widening the page on a phone. */}
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', lg: 'minmax(0, 5fr) minmax(0, 7fr)' }, gap: 2, alignItems: 'start' }}>
        <Box sx={{ display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: 2, minWidth: 0 }}>
          {canWrite && range && (
            <ReadingEntry
              runId={run.id}
              dialUnit={range.dialUnit}
              freqMinHz={range.freqMinHz}
              freqMaxHz={range.freqMaxHz}
              refusal={run.refusal}
              onSaved={() => void refresh()}
              counter={
                run.benchId === null
                  ? undefined
                  : {
                      bridgeLive,
                      capture: captureState.data?.capture ?? null,
                      feed: captureFeed,
                      nextMark: captureState.data?.nextMark ?? null,
                      onSettled: () => {
                        void refresh();
                        void captureState.refetch();
                      },
                    }
              }
            />
          )}
          {data ? (
            <FitSummary analysis={data} />
          ) : (
            <Alert severity="info">{empty ? `${empty} The fit appears with the first readings.` : (problem ?? 'Loading the analysis…')}</Alert>
          )}
          {data && <CorrectionTable analysis={data} />}
        </Box>
        <Box sx={{ display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: 2, minWidth: 0 }}>
          {data && <ErrorChart analysis={data} skipAnimation={skipChartAnimation} />}
        </Box>
      </Box>
      {data && run.kind === 'as_found' && (
        <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', md: 'minmax(0, 1fr) minmax(0, 1fr)' }, gap: 2, alignItems: 'start', mt: 2 }}>
          <AlignmentPanel analysis={data} />
          <PaddingCalculator unit={unit} />
        </Box>
      )}
      <Box sx={{ mt: 2 }}>
        <ReadingsTable runId={run.id} unit={unit} resolutionHz={0.1} canExclude={canWrite && !run.refusal} onExcluded={() => void refresh()} />
      </Box>
    </>
  );
}
