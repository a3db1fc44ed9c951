import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { ReviewAction, ReviewEvent } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { formatDateTime } from '@/utils/format';

const ACTION_LABELS: Record<ReviewAction, string> = {
  submit: 'Submitted for review',
  return: 'Returned with comments',
  sign: 'Signed and issued',
  sign_refused: 'Signing refused',
  amend: 'Reopened for amendment',
  withdraw: 'Certificate withdrawn',
};

/** Submissions, returns, signatures and refusals, newest first. */
export function ReviewHistory({ history }: { history: readonly ReviewEvent[] }) {
  const events = [...history].sort((a, b) => b.at.localeCompare(a.at));
  return (
    <Paper variant="outlined" component="section" aria-label="Review history" sx={{ p: 2, mb: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        History
      </Typography>
      {events.length === 0 ? (
        <Typography color="text.secondary">No review events yet.</Typography>
      ) : (
        <Box component="ol" sx={{ listStyle: 'none', p: 0, m: 0, display: 'grid', gap: 1 }}>
          {events.map((e) => (
            <Box component="li" key={e.id} sx={{ display: 'grid', gridTemplateColumns: '10.5rem 1fr', gap: 1.5 }}>
              <Num sx={{ color: 'text.secondary', fontSize: '0.85rem' }}>{formatDateTime(e.at)}</Num>
              <Box>
                <Typography variant="body2" sx={{ fontWeight: 500 }}>
                  {ACTION_LABELS[e.action] ?? e.action}
                  {e.actorName ? ` · ${e.actorName}` : ''}
                </Typography>
                {e.comment && (
                  <Typography variant="body2" color="text.secondary" sx={{ whiteSpace: 'pre-wrap' }}>
                    {e.comment}
                  </Typography>
                )}
              </Box>
            </Box>
          ))}
        </Box>
      )}
    </Paper>
  );
}
