import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import type { Reading, RunBridge, RunDataKind } from '@kilocycle/common/types';
import type { RunBridgeChange } from '@kilocycle/common/events';
import { BridgeChip } from '@/components/ui/bridge-chip';
import { Num } from '@/components/ui/num';
import { formatSeconds } from '@/utils/data-kind';
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

type LiveStatusProps = {
  state: LiveFeedState;
  message?: string | null;
  readingCount: number;
  last: Reading | null;
  lastArrivalAt: number | null;
  /** The run's bench bridge (as loaded, then as pushed live): the chip says Live only while one is connected. */
  bridge: RunBridge;
  bridgeChange: RunBridgeChange | null;
  /** A phase run's newest reading is a time interval (s). */
  dataKind?: RunDataKind;
};

/**
 * Whether a bench bridge feeds the run (the chip), how many readings the page holds and the newest one. The
 * page's own feed (its socket) speaks only when something is wrong with it, in the message.
 */
export function LiveStatus({ state, message, readingCount, last, lastArrivalAt, bridge, bridgeChange, dataKind = 'frequency' }: LiveStatusProps) {
  return (
    <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5, flexWrap: 'wrap' }} data-testid="live-status" aria-live="polite">
      {state === 'closed' ? (
        <Chip size="small" color={COLORS[state]} variant="outlined" label={LABELS[state]} />
      ) : (
        <BridgeChip bridge={bridge} change={bridgeChange} lastArrivalAt={lastArrivalAt} />
      )}
      {(state === 'connecting' || state === 'offline' || state === 'refused') && !message && (
        <Typography variant="body2" color="text.secondary">
          Live feed: {LABELS[state].toLowerCase()}
        </Typography>
      )}
      <Typography variant="body2">
        <Num>{formatCount(readingCount)}</Num> readings
      </Typography>
      {last && (
        <Typography variant="body2" color="text.secondary">
          last{dataKind === 'phase' ? ' time interval' : ''}{' '}
          <Num>{dataKind === 'phase' ? `${formatSeconds(last.frequency)} s` : formatHzTo(last.frequency, 0.01)}</Num> at <Num>{formatDuration(last.t)}</Num>
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
