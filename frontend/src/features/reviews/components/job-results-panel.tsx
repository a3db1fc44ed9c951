import Alert from '@mui/material/Alert';
import CircularProgress from '@mui/material/CircularProgress';
import Box from '@mui/material/Box';
import { ErrorBoundary } from '@/components/errors/error-boundary';
import { useJobResults } from '../api/get-job-results';
import { ResultsOverview } from './results-overview';

function Panel({ jobId }: { jobId: number }) {
  const results = useJobResults(jobId);
  if (results.isPending) {
    return (
      <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', color: 'text.secondary', py: 2 }}>
        <CircularProgress size={18} /> Computing the results…
      </Box>
    );
  }
  if (results.isError) return <Alert severity="error">The results could not be loaded: {results.error.message}</Alert>;
  return <ResultsOverview results={results.data} />;
}

/** The results and budgets of a job, for the job page: per range and setting, with the budget behind any point. */
export function JobResultsPanel({ jobId }: { jobId: number }) {
  return (
    <ErrorBoundary>
      <Panel jobId={jobId} />
    </ErrorBoundary>
  );
}
