import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import { useEffect, useState } from 'react';
import type { Reading } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { formatDuration, formatHzTo } from '@/utils/frequency';
import { formatCount } from '@/utils/measurement';

export type LiveFeedState = 'connecting' | 'live' | 'offline' | 'refused' | 'closed';

const LABELS: Record<LiveFeedState, string> = {
  connecting: 'Connecting',
  live: 'Live',
  offline: 'Offline',
  refused: 'Not following',
  closed: 'Run closed',
};
const COLORS: Record<LiveFeedState, 'default' | 'success' | 'warning' | 'error'> = {
  connecting: 'default',
  live: 'success',
  offline: 'warning',
  refused: 'error',
  closed: 'default',
};

type LiveStatusProps = { state: LiveFeedState; message?: string | null; readingCount: number; last: Reading | null; lastArrivalAt: number | null };

/** Whether the page follows the run, how many readings it holds and the newest one. */
export function LiveStatus({ state, message, readingCount, last, lastArrivalAt }: LiveStatusProps) {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(timer);
  }, []);
  return (
    <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5, flexWrap: 'wrap' }} data-testid="live-status" aria-live="polite">
      <Chip size="small" color={COLORS[state]} variant={state === 'live' ? 'filled' : 'outlined'} label={LABELS[state]} />
      <Typography variant="body2">
        <Num>{formatCount(readingCount)}</Num> readings
      </Typography>
      {last && (
        <Typography variant="body2" color="text.secondary">
          last <Num>{formatHzTo(last.frequency, 0.01)}</Num> at <Num>{formatDuration(last.t)}</Num>
          {lastArrivalAt && (
            <>
              {' '}
              (<Num>{formatDuration((now - lastArrivalAt) / 1000)}</Num> ago)
            </>
          )}
        </Typography>
      )}
      {message && (
        <Typography variant="body2" color={state === 'refused' ? 'error' : 'text.secondary'}>
          {message}
        </Typography>
      )}
    </Box>
  );
}
