import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { ReviewFlag, ReviewFlagKind } from '@kilocycle/common/types';

const KIND_LABELS: Record<ReviewFlagKind, string> = {
  outlier: 'Outlier',
  excluded_reading: 'Excluded reading',
  standard_override: 'Standard used past its due date',
  standard_overdue: 'Standard overdue',
  tur_low: 'TUR below 4:1',
  no_standard: 'No standard',
  no_calibration_run: 'No calibration run',
  no_as_left: 'No as-left run',
  extra_run: 'Extra run',
  point_not_conforming: 'Point does not conform',
  computation: 'Computation',
  self_captured: 'Captured by the signatory',
};

const SEVERITY_ORDER = { blocker: 0, warning: 1, info: 2 } as const;
const SEVERITY_ALERT = { blocker: 'error', warning: 'warning', info: 'info' } as const;
const SEVERITY_TITLE = { blocker: 'Stops signing', warning: 'Look at these', info: 'For the record' } as const;

type ReviewFlagsProps = { flags: readonly ReviewFlag[]; signBlockers: readonly string[] };

/** What the lead should look at before signing, most serious first; blockers say why signing is not possible. */
export function ReviewFlags({ flags, signBlockers }: ReviewFlagsProps) {
  const sorted = [...flags].sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity]);
  const groups = (['blocker', 'warning', 'info'] as const)
    .map((severity) => ({ severity, items: sorted.filter((f) => f.severity === severity) }))
    .filter((g) => g.items.length > 0);
  const blockerMessages = new Set(sorted.filter((f) => f.severity === 'blocker').map((f) => f.message));
  const otherBlockers = signBlockers.filter((b) => !blockerMessages.has(b));

  return (
    <Paper variant="outlined" component="section" aria-label="Flags" sx={{ p: 2, mb: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Flags
      </Typography>
      {groups.length === 0 && otherBlockers.length === 0 && (
        <Typography color="text.secondary">
          Nothing flagged: no outliers, no excluded readings, no overridden or overdue standards, every TUR at 4:1 or better.
        </Typography>
      )}
      <Box sx={{ display: 'grid', gap: 1 }}>
        {otherBlockers.length > 0 && (
          <Alert severity="error">
            <AlertTitle>Cannot be signed now</AlertTitle>
            <ul style={{ margin: 0, paddingLeft: '1.1rem' }}>
              {otherBlockers.map((b) => (
                <li key={b}>{b}</li>
              ))}
            </ul>
          </Alert>
        )}
        {groups.map(({ severity, items }) => (
          <Alert severity={SEVERITY_ALERT[severity]} key={severity}>
            <AlertTitle>{SEVERITY_TITLE[severity]}</AlertTitle>
            <ul style={{ margin: 0, paddingLeft: '1.1rem' }}>
              {items.map((flag, index) => (
                <li key={`${flag.kind}-${index}`}>
                  <strong>{KIND_LABELS[flag.kind] ?? flag.kind}:</strong> {flag.message}
                </li>
              ))}
            </ul>
          </Alert>
        ))}
      </Box>
    </Paper>
  );
}
