import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { ApiError } from '@/lib/api-client';
import { downloadFile } from '@/lib/file-transfer';
import { notify } from '@/lib/notifications';

/** A job's results, one line per calibration run and setting, as CSV (GET /api/jobs/:id/results.csv). */
export function DownloadResultsCsv({ jobId, jobNumber }: { jobId: number; jobNumber?: string }) {
  const [busy, setBusy] = useState(false);
  const download = async () => {
    setBusy(true);
    try {
      await downloadFile(`/jobs/${jobId}/results.csv`, `${jobNumber ?? `job-${jobId}`}-results.csv`);
    } catch (error) {
      notify('error', error instanceof ApiError ? `The results could not be exported: ${error.message}` : 'The results could not be exported.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Button variant="outlined" startIcon={<DownloadOutlined />} onClick={() => void download()} disabled={busy}>
      {busy ? 'Preparing…' : 'Download results CSV'}
    </Button>
  );
}
