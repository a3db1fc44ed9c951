import Chip from '@mui/material/Chip';
import type { RunDataKind, RunKind, RunStatus } from '@kilocycle/common/types';
import { DATA_KIND_LABELS } from '@/utils/data-kind';

export const RUN_KIND_LABELS: Record<RunKind, string> = {
  as_found: 'As found',
  as_left: 'As left',
  warmup: 'Warm-up',
  stability: 'Stability',
  supply_sensitivity: 'Supply sensitivity',
  keying: 'Keying',
};

export function RunKindChip({ kind }: { kind: RunKind }) {
  const calibration = kind === 'as_found' || kind === 'as_left';
  return (
    <Chip
      size="small"
      variant="outlined"
      color={calibration ? 'primary' : 'secondary'}
      label={RUN_KIND_LABELS[kind]}
      sx={{ height: 22, fontSize: '0.75rem' }}
    />
  );
}

export function RunStatusChip({ status }: { status: RunStatus }) {
  return (
    <Chip
      size="small"
      color={status === 'open' ? 'success' : 'default'}
      variant={status === 'open' ? 'filled' : 'outlined'}
      label={status === 'open' ? 'Open' : 'Closed'}
      sx={{ height: 22, fontSize: '0.75rem' }}
    />
  );
}

/** What a stability run's readings hold: "Phase data (time interval, s)" or "Frequency data (Hz)". */
export function RunDataKindChip({ dataKind }: { dataKind: RunDataKind }) {
  return (
    <Chip
      size="small"
      variant="outlined"
      color={dataKind === 'phase' ? 'info' : 'default'}
      label={DATA_KIND_LABELS[dataKind]}
      data-testid="run-data-kind"
      sx={{ height: 22, fontSize: '0.75rem' }}
    />
  );
}
