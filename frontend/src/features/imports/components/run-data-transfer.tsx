import Box from '@mui/material/Box';
import { CALIBRATION_RUN_KINDS, type Role, type Run } from '@kilocycle/common/types';
import { DownloadReadingsCsv } from './download-readings-csv';
import { ImportReadings } from './import-readings';

// Who may add readings to which runs, as the API decides it: the bench roles anywhere, the engineer on studies.
function mayImport(role: Role, run: Pick<Run, 'kind'>): boolean {
  if (role === 'admin' || role === 'lead' || role === 'technician') return true;
  return role === 'engineer' && !CALIBRATION_RUN_KINDS.includes(run.kind);
}

/** "Import CSV" and "Download readings CSV" for a run page. */
export function RunDataTransfer({ run, role }: { run: Pick<Run, 'id' | 'kind' | 'refusal'>; role: Role }) {
  const calibration = CALIBRATION_RUN_KINDS.includes(run.kind);
  return (
    <Box sx={{ display: 'flex', gap: 1, flexWrap: 'wrap' }}>
      {mayImport(role, run) && <ImportReadings runId={run.id} needsTime={!calibration} needsDial={calibration} refusal={run.refusal} />}
      {role !== 'client' && <DownloadReadingsCsv runId={run.id} />}
    </Box>
  );
}
