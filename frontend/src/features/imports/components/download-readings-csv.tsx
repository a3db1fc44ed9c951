import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { ApiError } from '@/lib/api-client';
import { downloadFile } from '@/lib/file-transfer';
import { notify } from '@/lib/notifications';

/** A run's readings, excluded ones included with their reasons, as CSV (GET /api/runs/:id/readings.csv). */
export function DownloadReadingsCsv({ runId }: { runId: number }) {
  const [busy, setBusy] = useState(false);
  const download = async () => {
    setBusy(true);
    try {
      await downloadFile(`/runs/${runId}/readings.csv`, `run-${runId}-readings.csv`);
    } catch (error) {
      notify('error', error instanceof ApiError ? `The readings could not be exported: ${error.message}` : 'The readings could not be exported.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Button variant="outlined" startIcon={<DownloadOutlined />} onClick={() => void download()} disabled={busy}>
      {busy ? 'Preparing…' : 'Download readings CSV'}
    </Button>
  );
}
