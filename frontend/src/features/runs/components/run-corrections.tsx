import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { AuditEventView } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { formatDateTime } from '@/utils/format';
import { useRunCorrections } from '../api/get-run-corrections';

const FIELD_LABELS: Record<string, string> = {
  standardName: 'Standard',
  supplyVoltage: 'Supply voltage',
  configuration: 'Configuration',
  notes: 'Notes',
};

type Change = { field: string; from: string; to: string };

function shown(field: string, value: unknown): string {
  if (value === null || value === undefined || value === '') return 'none';
  return field === 'supplyVoltage' ? `${String(value)} V` : String(value);
}

/** The from → to pairs of one correction (the standard by name; its id is kept for the record only). */
export function correctionChanges(event: AuditEventView): Change[] {
  const changes = event.changes ?? {};
  return Object.entries(FIELD_LABELS).flatMap(([field, label]) => {
    const value = changes[field] as { from?: unknown; to?: unknown } | undefined;
    if (!value || typeof value !== 'object') return [];
    return [{ field: label, from: shown(field, value.from), to: shown(field, value.to) }];
  });
}

/**
 * The run's corrections from the audit trail: who, when, what from → to, and why. Nothing when there are none.
 * `embedded` renders it as a part of another panel (the run's Notes) instead of a panel of its own.
 */
export function RunCorrections({ runId, embedded = false }: { runId: number; embedded?: boolean }) {
  const corrections = useRunCorrections({ runId });
  const items = corrections.data?.items ?? [];
  if (items.length === 0) return null;
  return (
    <Box
      component="section"
      aria-label="Corrections of this run"
      sx={embedded ? { mt: 1 } : { p: 1.5, mt: 1.5, border: 1, borderColor: 'divider', borderRadius: 1, bgcolor: 'background.paper' }}
    >
      <Typography variant="subtitle2" component={embedded ? 'h3' : 'h2'} sx={{ mb: 0.5 }}>
        Corrections of this run
      </Typography>
      <Box component="ul" sx={{ m: 0, pl: 2.5, display: 'grid', gap: 0.75 }}>
        {items.map((event) => (
          <Typography component="li" variant="body2" key={event.id}>
            <Num>{formatDateTime(event.at)}</Num>, {event.actorName ?? 'the system'}:{' '}
            {correctionChanges(event).map((c, i) => (
              <Box component="span" key={c.field}>
                {i > 0 && '; '}
                {c.field}{' '}
                <Box component="span" sx={{ color: 'text.secondary' }}>
                  {c.from}
                </Box>{' '}
                → <strong>{c.to}</strong>
              </Box>
            ))}
            {typeof event.changes?.reason === 'string' && (
              <Box component="span" sx={{ display: 'block', color: 'text.secondary' }}>
                Why: {event.changes.reason}
              </Box>
            )}
          </Typography>
        ))}
      </Box>
    </Box>
  );
}
