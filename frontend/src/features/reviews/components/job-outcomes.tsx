import Box from '@mui/material/Box';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import type { JobOutcome, JobOutcomes as Outcomes } from '@kilocycle/common/types';
import { DecisionChip } from '@/components/ui/decision-chip';

const SIDES = [
  { key: 'asFound', label: 'As found', long: 'As found, before adjustment' },
  { key: 'asLeft', label: 'As left', long: 'As left, after adjustment' },
] as const;

function color(o: JobOutcome | null): string {
  if (!o || o.decision === null) return 'text.secondary';
  if (o.outOfTolerance > 0) return 'error.main';
  return o.conditional > 0 ? 'warning.dark' : 'success.dark';
}

function sideWords(outcomes: Outcomes, key: 'asFound' | 'asLeft'): string {
  const o = outcomes[key];
  if (o) return o.words;
  return key === 'asLeft' ? 'not adjusted: the as-found results are the final ones' : 'not measured';
}

/**
 * The job's two outcomes, as found and as left, each with its worst decision and in words
 * ("out of tolerance at 3 of 10 settings"): an as-found failure is never hidden behind a final pass.
 * `compact` shows only the two labelled chips, with the words in a tooltip (for page headers).
 */
export function JobOutcomesSummary({ outcomes, compact = false }: { outcomes: Outcomes; compact?: boolean }) {
  if (compact) {
    return (
      <Box component="span" sx={{ display: 'inline-flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }} aria-label="Outcomes">
        {SIDES.map(({ key, label, long }) => (
          <Tooltip key={key} title={`${long}: ${sideWords(outcomes, key)}`}>
            <Box component="span" sx={{ display: 'inline-flex', gap: 0.5, alignItems: 'center' }}>
              <Box component="span" sx={{ color: 'text.secondary', fontSize: '0.8125rem' }}>
                {label}
              </Box>
              <DecisionChip decision={outcomes[key]?.decision} emptyLabel={key === 'asLeft' && !outcomes.asLeft ? 'Not adjusted' : 'Not decided'} />
            </Box>
          </Tooltip>
        ))}
      </Box>
    );
  }
  return (
    <Box
      component="dl"
      aria-label="Outcomes"
      sx={{
        display: 'grid',
        gridTemplateColumns: { xs: '1fr', sm: 'max-content max-content 1fr' },
        columnGap: 1.5,
        rowGap: 0.75,
        alignItems: 'center',
        m: 0,
        '& dd': { m: 0 },
      }}
    >
      {SIDES.map(({ key, long }) => (
        <Box key={key} sx={{ display: 'contents' }}>
          <Typography component="dt" variant="body2" color="text.secondary">
            {long}
          </Typography>
          <Box component="dd" sx={{ display: { xs: 'none', sm: 'block' } }}>
            <DecisionChip decision={outcomes[key]?.decision} emptyLabel={key === 'asLeft' && !outcomes.asLeft ? 'Not adjusted' : 'Not decided'} />
          </Box>
          <Typography component="dd" variant="body2" sx={{ color: color(outcomes[key]), fontWeight: 500, mb: { xs: 0.5, sm: 0 } }}>
            {sideWords(outcomes, key).replace(/^./, (c) => c.toUpperCase())}
          </Typography>
        </Box>
      ))}
      {outcomes.asLeft && outcomes.asFoundFinalRanges.length > 0 && (
        <Typography variant="body2" color="text.secondary" sx={{ gridColumn: '1 / -1' }}>
          Not adjusted, so the as-found results are final: {outcomes.asFoundFinalRanges.join('; ')}.
        </Typography>
      )}
    </Box>
  );
}
