import Box from '@mui/material/Box';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import { useEffect, useState } from 'react';
import type { RunBridge } from '@kilocycle/common/types';
import type { RunBridgeChange } from '@kilocycle/common/events';
import { Num } from '@/components/ui/num';
import { formatDuration } from '@/utils/frequency';

type BridgeChipProps = {
  /** The run's bridge as loaded with the run. */
  bridge: RunBridge;
  /** The latest online/offline change pushed live (wins over `bridge` once it arrives). */
  change: RunBridgeChange | null;
  /** When this page last received a reading live (browser clock). */
  lastArrivalAt: number | null;
};

/** Wall-clock time as the bench reads it: 14:03:22. */
export function clockTime(iso: string): string {
  return new Date(iso).toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', second: '2-digit', hour12: false });
}

/**
 * The bench bridge as it is: "Live" only while a bridge for the run is connected, with the age of the newest
 * reading (ticking); "Bridge offline since 14:03:22" once it drops; nothing on a run no bridge has fed.
 */
export function BridgeChip({ bridge, change, lastArrivalAt }: BridgeChipProps) {
  const connected = change ? change.connected : bridge.connected;
  const since = change ? change.since : bridge.since;
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!connected) return;
    const timer = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(timer);
  }, [connected]);
  if (!connected && since === null) return null;
  if (!connected) {
    return <Chip size="small" color="warning" variant="outlined" label={`Bridge offline since ${clockTime(since!)}`} data-testid="bridge-chip" />;
  }
  const stored = bridge.lastReadingAt ? Date.parse(bridge.lastReadingAt) : null;
  const newest = Math.max(lastArrivalAt ?? 0, stored ?? 0) || null;
  return (
    <Box component="span" sx={{ display: 'inline-flex', alignItems: 'center', gap: 1 }} data-testid="bridge-chip">
      <Chip size="small" color="success" label="Live" />
      <Typography variant="body2" color="text.secondary" component="span">
        {newest === null ? (
          'no reading yet'
        ) : (
          <>
            last reading <Num>{formatDuration(Math.max(0, (now - newest) / 1000))}</Num> ago
          </>
        )}
      </Typography>
    </Box>
  );
}
