import Chip from '@mui/material/Chip';
import type { Decision } from '@kilocycle/common/types';

export const DECISION_LABELS: Record<Decision, string> = {
  pass: 'Pass',
  conditional_pass: 'Conditional pass',
  conditional_fail: 'Conditional fail',
  fail: 'Fail',
};

const COLORS: Record<Decision, 'success' | 'warning' | 'error'> = {
  pass: 'success',
  conditional_pass: 'success',
  conditional_fail: 'warning',
  fail: 'error',
};

/** A conformity decision; the conditional ones are outlined, as they carry the uncertainty's caveat. */
export function DecisionChip({ decision, emptyLabel = 'Not decided' }: { decision: Decision | null | undefined; emptyLabel?: string }) {
  if (!decision) return <Chip size="small" variant="outlined" label={emptyLabel} sx={{ height: 20, fontSize: '0.75rem' }} />;
  const conditional = decision.startsWith('conditional');
  return (
    <Chip
      size="small"
      color={COLORS[decision]}
      variant={conditional ? 'outlined' : 'filled'}
      label={DECISION_LABELS[decision]}
      sx={{ height: 20, fontSize: '0.75rem', fontWeight: 500 }}
    />
  );
}
