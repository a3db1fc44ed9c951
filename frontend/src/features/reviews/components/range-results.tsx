import WarningAmberOutlined from '@mui/icons-material/WarningAmberOutlined';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Tab from '@mui/material/Tab';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Tabs from '@mui/material/Tabs';
import Tooltip from '@mui/material/Tooltip';
import Typography from '@mui/material/Typography';
import { useState, type MouseEvent } from 'react';
import { FREQUENCY_UNIT_HZ } from '@kilocycle/common/units';
import type { MeasuredPoint, PointResult, RangeResult, RunFitSummary } from '@kilocycle/common/types';
import { DecisionChip } from '@/components/ui/decision-chip';
import { numberSx } from '@/components/ui/num';
import { formatHz, formatNumber, formatSignificant } from '@/utils/frequency';
import { formatDial, formatError, formatTur, formatUncertainty, rangeUnit, toleranceText } from '../utils/results-format';
import { BudgetTable } from './budget-table';
import { ErrorChart } from './error-chart';

const num = { ...numberSx, fontSize: '0.8125rem', textAlign: 'right' } as const;
const groupStart = { borderLeft: 1, borderLeftColor: 'divider' } as const;

type Side = 'asFound' | 'asLeft';

function Measured({ point, unit }: { point: MeasuredPoint; unit: ReturnType<typeof rangeUnit> }) {
  const spread = point.sd === null ? 'one reading' : `${point.n} readings, s = ${formatSignificant(point.sd, 2)} Hz`;
  return (
    <Tooltip title={`Mean of ${spread}${point.outlier ? ' · outlier (studentised residual above 3)' : ''}`}>
      <span>
        {formatHz(point.measured, unit)}
        {point.outlier && (
          <Box component="span" sx={{ color: 'warning.main', ml: 0.5 }} aria-label="outlier">
            ◆
          </Box>
        )}
      </span>
    </Tooltip>
  );
}

function Tur({ point }: { point: MeasuredPoint }) {
  if (point.tur === null) return <>—</>;
  if (!point.turFlag) return <>{formatTur(point.tur)}</>;
  return (
    <Tooltip title={`Test uncertainty ratio below 4:1: the uncertainty is large against the tolerance`}>
      <Box component="span" sx={{ color: 'warning.dark', fontWeight: 600, display: 'inline-flex', alignItems: 'center', gap: 0.25 }}>
        <WarningAmberOutlined sx={{ fontSize: 14 }} aria-label="flagged" />
        {formatTur(point.tur)}
      </Box>
    </Tooltip>
  );
}

function MeasuredCells({
  point,
  unit,
  withTur,
  side,
  onPick,
}: {
  point: MeasuredPoint | null;
  unit: ReturnType<typeof rangeUnit>;
  withTur: boolean;
  side: Side;
  onPick: (side: Side) => void;
}) {
  const count = withTur ? 5 : 4;
  if (!point) {
    return (
      <TableCell colSpan={count} sx={{ ...groupStart, color: 'text.secondary', textAlign: 'center' }}>
        not measured
      </TableCell>
    );
  }
  // The row picks its final result; a cell picks its own side, and stops there.
  const pick = (event: MouseEvent) => {
    event.stopPropagation();
    onPick(side);
  };
  return (
    <>
      <TableCell sx={{ ...num, ...groupStart }} onClick={pick}>
        <Measured point={point} unit={unit} />
      </TableCell>
      <TableCell sx={num} onClick={pick} title={`${formatNumber(point.errorPpm, 1)} ppm`}>
        {formatError(point)}
      </TableCell>
      <TableCell sx={num} onClick={pick}>
        {point.budget ? (withTur ? `${formatUncertainty(point.budget.U)} (${point.budget.k.toFixed(2)})` : formatUncertainty(point.budget.U)) : '—'}
      </TableCell>
      {withTur && (
        <TableCell sx={num} onClick={pick}>
          <Tur point={point} />
        </TableCell>
      )}
      <TableCell onClick={pick}>
        {point.problem ? (
          <Tooltip title={point.problem}>
            <span>
              <DecisionChip decision={null} emptyLabel="No decision" />
            </span>
          </Tooltip>
        ) : (
          <DecisionChip decision={point.decision} />
        )}
      </TableCell>
    </>
  );
}

function FitSummary({ title, summary }: { title: string; summary: RunFitSummary | null }) {
  if (!summary) return null;
  const { fit, tracking } = summary;
  return (
    <Box>
      <Typography variant="overline" color="text.secondary">
        {title} · run {summary.runId}
      </Typography>
      {fit ? (
        <Box
          component="dl"
          sx={{
            display: 'grid',
            gridTemplateColumns: { xs: 'minmax(0, 1fr)', sm: 'max-content minmax(0, 1fr)' },
            columnGap: 2,
            rowGap: 0.25,
            m: 0,
            '& dt': { color: 'text.secondary' },
            '& dd': { m: 0, ...numberSx },
          }}
        >
          <dt>Intercept at 0 Hz</dt>
          <dd>
            {formatNumber(fit.offsetHz, 1)} ± {formatSignificant(fit.seOffset, 2)} Hz
          </dd>
          <dt>Scale error</dt>
          <dd>
            {formatNumber(fit.slope * 1e6, 1)} ± {formatSignificant(fit.seSlope * 1e6, 2)} ppm
          </dd>
          <dt>Residual SD</dt>
          <dd>{formatSignificant(fit.residualSd, 3)} Hz</dd>
          <dt>R²</dt>
          <dd>{fit.r2.toFixed(4)}</dd>
          {tracking && (
            <>
              <dt>Tracking, best-fit line</dt>
              <dd>
                max {formatNumber(tracking.bestFit.maxAbsHz, 1)} Hz · rms {formatNumber(tracking.bestFit.rmsHz, 1)} Hz
              </dd>
              <dt>Tracking, end-point line</dt>
              <dd>
                max {formatNumber(tracking.endPoint.maxAbsHz, 1)} Hz · rms {formatNumber(tracking.endPoint.rmsHz, 1)} Hz
              </dd>
            </>
          )}
        </Box>
      ) : (
        <Typography variant="body2" color="text.secondary">
          Too few settings for a line fit.
        </Typography>
      )}
    </Box>
  );
}

function PointBudgetPanel({ range, point, side, onSide }: { range: RangeResult; point: PointResult; side: Side; onSide: (side: Side) => void }) {
  const measured = point[side];
  const label = `Budget at ${formatDial(point.dial, range.dialUnit)} (${side === 'asFound' ? 'as found' : 'as left'})`;
  return (
    <Box sx={{ mt: 2 }} role="region" aria-label={label}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 2, flexWrap: 'wrap' }}>
        <Typography variant="h4" component="h4">
          Uncertainty budget at {formatDial(point.dial, range.dialUnit)}
        </Typography>
        <Tabs value={side} onChange={(_e, value: Side) => onSide(value)} sx={{ minHeight: 32, '& .MuiTab-root': { minHeight: 32, py: 0 } }}>
          <Tab value="asFound" label="As found" disabled={!point.asFound} />
          <Tab value="asLeft" label="As left" disabled={!point.asLeft} />
        </Tabs>
      </Box>
      {!measured ? (
        <Typography color="text.secondary">Not measured.</Typography>
      ) : measured.budget ? (
        <BudgetTable budget={measured.budget} caption={label} />
      ) : (
        <Alert severity="warning">{measured.problem ?? 'No budget could be formed for this point.'}</Alert>
      )}
    </Box>
  );
}

type RangeResultsProps = { range: RangeResult };

/** One range of a job: the error plot, the line fits, the results per setting and the budget of the chosen one. */
export function RangeResults({ range }: RangeResultsProps) {
  const unit = rangeUnit(range);
  // A direct-reading dial says its own nominal: one column then, not two saying the same.
  const dialScale = range.dialUnit === 'div' ? null : FREQUENCY_UNIT_HZ[range.dialUnit];
  const dialIsNominal = dialScale !== null && range.points.every((p) => Math.abs(p.dial * dialScale - p.nominal) < 1e-6 * Math.max(1, p.nominal));
  const [selected, setSelected] = useState<{ index: number; side: Side } | null>(null);
  const hasAsLeft = range.points.some((p) => p.asLeft);
  const point = selected ? range.points[selected.index] : undefined;

  const pick = (index: number, side?: Side) => {
    const p = range.points[index];
    if (!p) return;
    const fallback: Side = p.asLeft ? 'asLeft' : 'asFound';
    const chosen = side && p[side] ? side : fallback;
    setSelected((current) => (current && current.index === index && current.side === chosen && !side ? null : { index, side: chosen }));
  };

  return (
    <Paper variant="outlined" component="section" aria-label={`Range ${range.label}`} sx={{ p: 2, mb: 2 }}>
      <Box sx={{ display: 'flex', alignItems: 'center', gap: 1.5, flexWrap: 'wrap', mb: 1 }}>
        <Typography variant="h3" component="h3">
          Range {range.label}
        </Typography>
        <DecisionChip decision={range.decision} />
        <Typography variant="body2" color="text.secondary">
          Tolerance {toleranceText(range.tolerance)} · {formatHz(range.freqMinHz, unit)} to {formatHz(range.freqMaxHz, unit)}
        </Typography>
      </Box>
      {range.problems.map((problem) => (
        <Alert severity="warning" key={problem} sx={{ mb: 1 }}>
          {problem}
        </Alert>
      ))}
      <Box sx={{ display: 'grid', gridTemplateColumns: { xs: 'minmax(0, 1fr)', lg: 'minmax(0, 3fr) minmax(0, 2fr)' }, gap: 2, alignItems: 'start' }}>
        <ErrorChart range={range} />
        <Box sx={{ display: 'grid', gap: 1.5 }}>
          <FitSummary title="As found" summary={range.asFoundFit} />
          <FitSummary title="As left" summary={range.asLeftFit} />
        </Box>
      </Box>
      <Box sx={{ overflowX: 'auto', mt: 1 }}>
        <Table size="small" aria-label={`Results, range ${range.label}`} sx={{ '& td, & th': { py: 0.5, px: 1 } }}>
          <TableHead>
            <TableRow>
              {/* The corner above the setting columns heads nothing: a plain cell, not an empty header. */}
              <TableCell component="td" colSpan={dialIsNominal ? 2 : 3} />
              <TableCell colSpan={4} sx={{ ...groupStart, fontWeight: 600 }}>
                As found
              </TableCell>
              <TableCell colSpan={5} sx={{ ...groupStart, fontWeight: 600 }}>
                As left
              </TableCell>
            </TableRow>
            <TableRow>
              {!dialIsNominal && <TableCell>Setting</TableCell>}
              <TableCell sx={{ textAlign: 'right' }}>{dialIsNominal ? 'Setting (nominal)' : 'Nominal'}</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Tolerance</TableCell>
              <TableCell sx={{ ...groupStart, textAlign: 'right' }}>Measured</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Error</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>U</TableCell>
              <TableCell>Decision</TableCell>
              <TableCell sx={{ ...groupStart, textAlign: 'right' }}>Measured</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>Error</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>U (k)</TableCell>
              <TableCell sx={{ textAlign: 'right' }}>TUR</TableCell>
              <TableCell>Decision</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {range.points.map((p, index) => (
              <TableRow
                key={p.dial}
                hover
                selected={selected?.index === index}
                onClick={() => pick(index)}
                onKeyDown={(event) => {
                  if (event.key === 'Enter' || event.key === ' ') {
                    event.preventDefault();
                    pick(index);
                  }
                }}
                tabIndex={0}
                aria-label={`Setting ${formatDial(p.dial, range.dialUnit)}: show its budget`}
                sx={{ cursor: 'pointer' }}
              >
                {!dialIsNominal && <TableCell sx={{ ...num, textAlign: 'left' }}>{formatDial(p.dial, range.dialUnit)}</TableCell>}
                <TableCell sx={num}>{formatHz(p.nominal, unit)}</TableCell>
                <TableCell sx={num}>±{formatNumber(p.toleranceHz, 0)} Hz</TableCell>
                <MeasuredCells point={p.asFound} unit={unit} withTur={false} side="asFound" onPick={(side) => pick(index, side)} />
                <MeasuredCells point={p.asLeft} unit={unit} withTur side="asLeft" onPick={(side) => pick(index, side)} />
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </Box>
      {!hasAsLeft && (
        <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
          No as-left run: the as-found results are the final ones.
        </Typography>
      )}
      {point && selected ? (
        <PointBudgetPanel range={range} point={point} side={selected.side} onSide={(side) => setSelected({ index: selected.index, side })} />
      ) : (
        <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
          Choose a setting to see the uncertainty budget behind it.
        </Typography>
      )}
    </Paper>
  );
}
