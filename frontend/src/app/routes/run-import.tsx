import { useParams } from 'react-router-dom';
import { NotFound } from '@/components/errors/not-found';
import { runPath } from '@/config/paths';
import { RunImportPage } from '@/features/imports/components/run-import-page';

export default function RunImportRoute() {
  const runId = Number(useParams().runId);
  if (!Number.isInteger(runId) || runId <= 0) return <NotFound />;
  return <RunImportPage key={runId} runId={runId} runPath={runPath(runId)} />;
}
