import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { ComparisonResult } from '@kilocycle/common/types';
import { ErrorBoundary } from '@/components/errors/error-boundary';
import { formatDuration } from '@/utils/frequency';
import { AdevChart } from './adev-chart';
import { ComparedRuns } from './compared-runs';
import { ComparisonTable } from './comparison-table';
import { DriftChart } from './drift-chart';
import { SensitivityPanel } from './sensitivity-panel';

/** A computed comparison: the runs, the two plots, the table of differences and the instrument's sensitivities. */
export function ComparisonResultView({ result, fileTitle }: { result: ComparisonResult; fileTitle: string }) {
  return (
    // minmax(0, 1fr): a wide table scrolls inside its own panel instead of widening the page.
    <Box sx={{ display: 'grid', gridTemplateColumns: 'minmax(0, 1fr)', gap: 2 }}>
      <Typography variant="body2" color="text.secondary">
        {result.instrumentLabel} · {result.kind === 'warmup' ? 'warm-up' : 'stability'} runs aligned at power-on · settled when within {result.options.withinHz}{' '}
        Hz of f∞ · settled drift rate over {formatDuration(result.options.windowSeconds)} windows · intervals at {Math.round(result.confidence * 100)} %
      </Typography>
      <ErrorBoundary>
        <ComparedRuns result={result} />
      </ErrorBoundary>
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', xl: 'repeat(2, minmax(0, 1fr))' }, gap: 2 }}>
        <ErrorBoundary>
          <DriftChart result={result} fileTitle={fileTitle} />
        </ErrorBoundary>
        <ErrorBoundary>
          <AdevChart result={result} fileTitle={fileTitle} />
        </ErrorBoundary>
      </Box>
      {/* The differences table takes the page's width: its columns (each run, each difference and its interval) need it. */}
      <ErrorBoundary>
        <ComparisonTable result={result} fileTitle={fileTitle} />
      </ErrorBoundary>
      <ErrorBoundary>
        <SensitivityPanel sensitivity={result.sensitivity} />
      </ErrorBoundary>
    </Box>
  );
}
