import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { JobResults } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { formatDate } from '@/utils/format';
import { DECISION_RULE_LABELS } from '../utils/results-format';
import { JobOutcomesSummary } from './job-outcomes';
import { RangeResults } from './range-results';

type ResultsOverviewProps = { results: JobResults };

/** A job's results as the certificate will carry them: the rule, every range, and the standards they trace to. */
export function ResultsOverview({ results }: ResultsOverviewProps) {
  return (
    <Box>
      <Paper variant="outlined" sx={{ p: 2, mb: 2 }}>
        <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5, flexWrap: 'wrap', mb: 0.5 }}>
          <Typography variant="h3" component="h2">
            Results
          </Typography>
          <Typography variant="body2" color="text.secondary">
            {results.procedure.name} · {DECISION_RULE_LABELS[results.decisionRule]}
          </Typography>
        </Box>
        <Box sx={{ my: 1 }}>
          <JobOutcomesSummary outcomes={results.outcomes} />
        </Box>
        <Typography variant="body2" color="text.secondary">
          {results.decisionRuleText}
        </Typography>
      </Paper>
      {results.ranges.map((range) => (
        <RangeResults key={range.rangeId} range={range} />
      ))}
      {results.standards.length > 0 && (
        <Paper variant="outlined" sx={{ p: 2, mb: 2 }}>
          <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
            Reference standards
          </Typography>
          <Box sx={{ overflowX: 'auto' }}>
            <Table size="small" aria-label="Reference standards" sx={{ '& td, & th': { py: 0.5, px: 1 } }}>
              <TableHead>
                <TableRow>
                  <TableCell>Standard</TableCell>
                  <TableCell>Make and model</TableCell>
                  <TableCell>Serial</TableCell>
                  <TableCell>Its certificate</TableCell>
                  <TableCell>Due</TableCell>
                  <TableCell sx={{ textAlign: 'right' }}>Time base</TableCell>
                  <TableCell sx={{ textAlign: 'right' }}>Resolution</TableCell>
                  <TableCell sx={{ textAlign: 'right' }}>Calibration U</TableCell>
                </TableRow>
              </TableHead>
              <TableBody>
                {results.standards.map((s) => (
                  <TableRow key={s.id}>
                    <TableCell>{s.name}</TableCell>
                    <TableCell>{s.makeModel}</TableCell>
                    <TableCell sx={numberSx}>{s.serial}</TableCell>
                    <TableCell sx={numberSx}>{s.certificateNumber}</TableCell>
                    <TableCell sx={numberSx}>{formatDate(s.dueDate)}</TableCell>
                    <TableCell sx={{ ...numberSx, textAlign: 'right' }}>±{s.timebaseAccuracyPpm} ppm</TableCell>
                    <TableCell sx={{ ...numberSx, textAlign: 'right' }}>{s.resolutionHz} Hz</TableCell>
                    <TableCell sx={{ ...numberSx, textAlign: 'right' }}>
                      {s.calibrationUPpm} ppm (k = {s.calibrationK})
                    </TableCell>
                  </TableRow>
                ))}
              </TableBody>
            </Table>
          </Box>
        </Paper>
      )}
    </Box>
  );
}
