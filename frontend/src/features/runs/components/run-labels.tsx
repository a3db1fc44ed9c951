import Chip from '@mui/material/Chip';
import type { RunKind, RunStatus } from '@kilocycle/common/types';

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
