import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { lineAtMidSpan } from '@kilocycle/common/math';
import type { CalibrationRunAnalysis } from '@kilocycle/common/types';
import { Num } from '@/components/ui/num';
import { formatHz, formatNumber, formatSignedHz } from '@/utils/frequency';
import { formatCount } from '@/utils/measurement';

function Figure({ label, value, detail }: { label: string; value: ReactNode; detail?: ReactNode }) {
  return (
    <Box sx={{ display: 'contents' }}>
      <Typography variant="body2" color="text.secondary" component="dt" sx={{ whiteSpace: 'nowrap' }}>
        {label}
      </Typography>
      <Typography variant="body2" component="dd" sx={{ m: 0, textAlign: 'right' }}>
        <Num>{value}</Num>
        {detail && (
          <Typography variant="caption" color="text.secondary" component="div">
            <Num sx={{ whiteSpace: 'normal' }}>{detail}</Num>
          </Typography>
        )}
      </Typography>
    </Box>
  );
}

/** Error at mid-span, intercept, scale error, residual spread, R² and tracking error of the run, as the server computed them. */
export function FitSummary({ analysis }: { analysis: CalibrationRunAnalysis }) {
  const { fit, tracking, outliers, points } = analysis;
  // The line's value at the centre of the measured span: the error a person would expect there, unlike the
  // intercept, which lies at 0 Hz, far outside any range, and can have the opposite sign of every error measured.
  const midSpan =
    fit && points.length > 0
      ? lineAtMidSpan(
          fit,
          points.map((p) => p.nominal),
        )
      : null;
  return (
    <Paper variant="outlined" sx={{ p: 2 }} data-testid="fit-summary">
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Fit
      </Typography>
      <Box component="dl" sx={{ display: 'grid', gridTemplateColumns: 'auto 1fr', columnGap: 2, rowGap: 0.5, m: 0 }}>
        <Figure
          label="Readings"
          value={`${formatCount(analysis.usedCount)} used`}
          detail={`${formatCount(analysis.readingCount)} taken, ${formatCount(analysis.excludedCount)} excluded, ${points.length} settings`}
        />
        {fit && midSpan ? (
          <>
            <Figure
              label="Error at mid-span"
              value={formatSignedHz(midSpan.errorHz)}
              detail={`the line at ${formatHz(midSpan.nominalHz)}, mid-way across the settings`}
            />
            <Figure
              label="Intercept at 0 Hz"
              value={formatSignedHz(fit.offsetHz)}
              detail={`± ${formatNumber(fit.seOffset, 1)} Hz, where error = intercept + scale error × nominal`}
            />
            <Figure
              label="Scale error"
              value={`${formatNumber(fit.slope * 1e6, 1, true)} ppm`}
              detail={`${formatNumber(fit.slope * 100, 4, true)} %, ± ${formatNumber(fit.seSlope * 1e6, 1)} ppm`}
            />
            <Figure label="Residual SD" value={`${formatNumber(fit.residualSd, 1)} Hz`} />
            <Figure label="R²" value={formatNumber(fit.r2, 5)} />
          </>
        ) : (
          // A name-value pair like the others: a definition list holds only term and description groups.
          <Figure label="Line" value="not fitted yet" detail="needs readings at three or more settings" />
        )}
        {tracking && (
          <>
            <Figure
              label="Tracking, best fit"
              value={`${formatNumber(tracking.bestFit.maxAbsHz, 1)} Hz max`}
              detail={`${formatNumber(tracking.bestFit.rmsHz, 1)} Hz RMS`}
            />
            <Figure
              label="Tracking, end points"
              value={`${formatNumber(tracking.endPoint.maxAbsHz, 1)} Hz max`}
              detail={`${formatNumber(tracking.endPoint.rmsHz, 1)} Hz RMS`}
            />
          </>
        )}
      </Box>
      <Typography variant="body2" sx={{ mt: 1 }} color={outliers.length ? 'error' : 'text.secondary'}>
        {outliers.length === 0
          ? 'No outliers flagged.'
          : `Outliers flagged (kept, not removed): ${outliers.map((o) => `dial ${o.dial} (t = ${formatNumber(o.studentised, 1)})`).join(', ')}`}
      </Typography>
    </Paper>
  );
}
