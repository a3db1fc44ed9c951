import DownloadOutlined from '@mui/icons-material/DownloadOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { Fragment } from 'react';
import type { ComparisonResult } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { saveText } from '@/lib/file-transfer';
import { comparisonTableCsv, formatDifference, formatEstimate, formatInterval, runColor } from '../utils/comparison-format';
import { slug } from '../utils/chart-export';

const num = { ...numberSx, fontSize: '0.8125rem', textAlign: 'right' } as const;

/**
 * The figures side by side: each run's value with its standard error and 95 % interval, each later run's
 * difference to the first with its Welch interval, and the difference said in words.
 */
export function ComparisonTable({ result, fileTitle }: { result: ComparisonResult; fileTitle: string }) {
  const later = result.runs.slice(1);
  const columns = 1 + result.runs.length + later.length;
  return (
    <Paper variant="outlined" component="section" aria-label="Differences" sx={{ p: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, mb: 1 }}>
        <Typography variant="h3" component="h3" sx={{ flex: 1 }}>
          Differences, with 95 % intervals
        </Typography>
        <Button
          size="small"
          startIcon={<DownloadOutlined fontSize="small" />}
          onClick={() => saveText(comparisonTableCsv(result), `${slug(fileTitle)}-table.csv`)}
        >
          CSV
        </Button>
      </Box>
      <Box sx={{ overflowX: 'auto' }}>
        <Table size="small" aria-label="Comparison table" sx={{ '& td, & th': { py: 0.5, px: 1 } }}>
          <TableHead>
            <TableRow>
              <TableCell sx={{ minWidth: 170 }}>Quantity</TableCell>
              {result.runs.map((run, i) => (
                <TableCell key={run.runId} sx={{ textAlign: 'right', borderBottom: 3, borderBottomColor: runColor(i) }}>
                  {run.label}
                </TableCell>
              ))}
              {later.map((run, i) => (
                <TableCell key={run.runId} sx={{ textAlign: 'right', borderBottom: 3, borderBottomColor: runColor(i + 1), borderBottomStyle: 'dashed' }}>
                  Difference: {run.label.split(':')[0]} − {result.runs[0]!.label.split(':')[0]}
                </TableCell>
              ))}
            </TableRow>
          </TableHead>
          <TableBody>
            {result.rows.map((row) => {
              const sentences = row.differences.filter((d) => d !== null).map((d) => d.sentence);
              const problems = row.problems.map((p, i) => (p ? `${result.runs[i]!.label}: ${p}` : null)).filter((p) => p !== null);
              return (
                <Fragment key={row.quantity}>
                  <TableRow sx={{ '& td': { borderBottom: sentences.length + problems.length > 0 ? 0 : undefined } }}>
                    <TableCell>
                      <Tooltip title={row.method}>
                        <span>
                          {row.name}
                          {row.unit && (
                            <Typography component="span" variant="caption" color="text.secondary">
                              {' '}
                              ({row.unit})
                            </Typography>
                          )}
                        </span>
                      </Tooltip>
                    </TableCell>
                    {row.values.map((value, i) => (
                      <TableCell key={i} sx={num}>
                        {value ? (
                          <Tooltip
                            title={`95 % interval ${formatInterval(value.low, value.high, row.unit, value.se)} · ${Number.isFinite(value.df) ? `${Math.round(value.df)} degrees of freedom` : 'exact'}`}
                          >
                            <span>{formatEstimate(value, row.unit)}</span>
                          </Tooltip>
                        ) : (
                          '—'
                        )}
                      </TableCell>
                    ))}
                    {row.differences.slice(1).map((diff, i) => (
                      <TableCell key={i} sx={num}>
                        {diff ? (
                          <>
                            {formatDifference(diff, row.unit)}
                            <Box component="span" sx={{ display: 'block', color: 'text.secondary', fontSize: '0.75rem' }}>
                              {formatInterval(diff.low, diff.high, row.unit, diff.se)}
                            </Box>
                          </>
                        ) : (
                          '—'
                        )}
                      </TableCell>
                    ))}
                  </TableRow>
                  {sentences.length + problems.length > 0 && (
                    <TableRow>
                      <TableCell colSpan={columns} sx={{ pt: 0, color: 'text.secondary' }}>
                        {sentences.map((sentence) => (
                          <Typography key={sentence} variant="body2" sx={{ fontStyle: 'italic', color: 'text.primary' }} data-testid="comparison-sentence">
                            {sentence}.
                          </Typography>
                        ))}
                        {problems.map((problem) => (
                          <Typography key={problem} variant="caption" component="p">
                            {problem}
                          </Typography>
                        ))}
                      </TableCell>
                    </TableRow>
                  )}
                </Fragment>
              );
            })}
          </TableBody>
        </Table>
      </Box>
    </Paper>
  );
}
