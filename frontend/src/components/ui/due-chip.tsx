import Chip from '@mui/material/Chip';

/** Days from today (local) to a `YYYY-MM-DD` date; negative when it has passed. */
export function daysUntil(date: string, today = new Date()): number {
  const [y, m, d] = date.slice(0, 10).split('-').map(Number);
  const due = Date.UTC(y ?? 1970, (m ?? 1) - 1, d ?? 1);
  const now = Date.UTC(today.getFullYear(), today.getMonth(), today.getDate());
  return Math.round((due - now) / 86_400_000);
}

export type DueState = 'overdue' | 'soon' | 'ok' | 'none';

/** Overdue once the date has passed; "soon" within 30 days. */
export function dueState(date: string | null | undefined, today = new Date()): DueState {
  if (!date) return 'none';
  const days = daysUntil(date, today);
  if (days < 0) return 'overdue';
  if (days <= 30) return 'soon';
  return 'ok';
}

/** A warning beside a due date: red when overdue, amber within 30 days, nothing otherwise. */
export function DueChip({ date }: { date: string | null | undefined }) {
  const state = dueState(date);
  if (!date || (state !== 'overdue' && state !== 'soon')) return null;
  const days = daysUntil(date);
  const label = state === 'overdue' ? `Overdue ${-days} d` : days === 0 ? 'Due today' : `Due in ${days} d`;
  return (
    <Chip
      size="small"
      color={state === 'overdue' ? 'error' : 'warning'}
      variant={state === 'overdue' ? 'filled' : 'outlined'}
      label={label}
      sx={{ height: 20, fontSize: '0.75rem' }}
    />
  );
}
