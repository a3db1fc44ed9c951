import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { JobReview } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { formatDate } from '@/utils/format';

/** The job as received: customer, instrument, condition, who did the work and in what surroundings. */
export function JobSummary({ review }: { review: JobReview }) {
  const { job, amendment } = review;
  return (
    <Paper variant="outlined" component="section" aria-label="Job" sx={{ p: 2, mb: 2 }}>
      <Box
        component="dl"
        sx={{
          display: 'grid',
          gridTemplateColumns: { xs: 'max-content 1fr', md: 'max-content 1fr max-content 1fr' },
          columnGap: 2,
          rowGap: 0.5,
          m: 0,
          '& dt': { color: 'text.secondary' },
          '& dd': { m: 0 },
        }}
      >
        <dt>Customer</dt>
        <dd>{job.organizationName}</dd>
        <dt>Instrument</dt>
        <dd>{job.instrumentLabel}</dd>
        <dt>Received</dt>
        <dd>
          <Num>{formatDate(job.receivedDate)}</Num>
        </dd>
        <dt>Technician</dt>
        <dd>{job.technicianName ?? '—'}</dd>
        <dt>Surroundings</dt>
        <dd>
          <Num>
            {job.ambientTempC === null ? '—' : `${job.ambientTempC} °C`} · {job.humidityPct === null ? '—' : `${job.humidityPct} % RH`}
          </Num>
        </dd>
        <dt>Procedure</dt>
        <dd>{review.results.procedure.name}</dd>
      </Box>
      {job.conditionReceived && (
        <Typography variant="body2" sx={{ mt: 1 }}>
          <Box component="span" sx={{ color: 'text.secondary' }}>
            Condition as received:{' '}
          </Box>
          {job.conditionReceived}
        </Typography>
      )}
      {amendment && (
        <Typography variant="body2" sx={{ mt: 1, color: 'warning.dark' }}>
          Amendment of certificate {amendment.certificateNumber}: signing issues revision {amendment.revision}, replacing revision {amendment.replacesRevision}.
          Reason: {amendment.reason}
        </Typography>
      )}
    </Paper>
  );
}
