import Box from '@mui/material/Box';
import InputAdornment from '@mui/material/InputAdornment';
import Paper from '@mui/material/Paper';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useMemo, useState, type ReactNode } from 'react';
import { alignLC } from '@kilocycle/common/math';
import type { CalibrationRunAnalysis } from '@kilocycle/common/types';
import { parseNumber } from '@kilocycle/common/units';
import { Num, numberSx } from '@/components/ui/num';
import { formatHz, formatNumber, formatSignedHz } from '@/utils/frequency';
import { SafetyCaution } from '@/components/ui/safety-caution';

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Box sx={{ display: 'contents' }}>
      <Typography variant="body2" color="text.secondary" component="dt">
        {label}
      </Typography>
      <Typography variant="body2" component="dd" sx={{ m: 0, textAlign: 'right' }}>
        {children}
      </Typography>
    </Box>
  );
}

/**
 * The two-end alignment of an LC oscillator from the as-found run: the inductance and parallel-capacitance moves
 * that put both ends on their marks, and what is then left at mid-range.
 */
export function AlignmentPanel({ analysis }: { analysis: CalibrationRunAnalysis }) {
  const [capText, setCapText] = useState('');
  const alignment = analysis.alignment;

  const withPf = useMemo(() => {
    if (!alignment || !capText.trim()) return null;
    try {
      const pf = parseNumber(capText);
      if (!(pf > 0)) return { error: 'A capacitance above 0 pF' };
      const result = alignLC({
        lowMeasured: alignment.low.measured,
        lowTarget: alignment.low.target,
        highMeasured: alignment.high.measured,
        highTarget: alignment.high.target,
        tuningCapLowPf: pf,
        ...(alignment.mid ? { midMeasured: alignment.mid.measured, midTarget: alignment.mid.target } : {}),
      });
      return { pf, change: result.parallelCapChangePf };
    } catch (error) {
      return { error: error instanceof Error ? error.message : String(error) };
    }
  }, [alignment, capText]);

  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Alignment
      </Typography>
      <Box sx={{ mb: 1.5 }}>
        <SafetyCaution compact>Alignment is done inside a working set, with the high tension on: use an insulated trimming tool.</SafetyCaution>
      </Box>
      {!alignment ? (
        <Typography variant="body2" color="text.secondary">
          {analysis.alignmentNote ?? 'Measure both ends of the range to work out the alignment.'}
        </Typography>
      ) : (
        <>
          <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
            For f = 1/(2π√(LC)), from dial <Num>{alignment.low.dial}</Num> and <Num>{alignment.high.dial}</Num>: the coil and trimmer moves that put both ends
            on their marks at once.
          </Typography>
          <Box component="dl" sx={{ display: 'grid', gridTemplateColumns: 'auto 1fr', columnGap: 2, rowGap: 0.5, m: 0 }}>
            <Row label="Low end now">
              <Num>
                {formatHz(alignment.low.measured)} for {formatHz(alignment.low.target)}
              </Num>
            </Row>
            <Row label="High end now">
              <Num>
                {formatHz(alignment.high.measured)} for {formatHz(alignment.high.target)}
              </Num>
            </Row>
            <Row label="Inductance">
              <Num>{formatNumber(alignment.inductanceChange * 100, 3, true)} %</Num>
            </Row>
            <Row label="Parallel capacitance">
              <Num>{formatNumber(alignment.parallelCapChangeFraction * 100, 3, true)} % of C at the low end</Num>
            </Row>
            {withPf && 'change' in withPf && withPf.change !== null && (
              <Row label={`With ${formatNumber(withPf.pf, 1)} pF`}>
                <Num>{formatNumber(withPf.change, 2, true)} pF in parallel</Num>
              </Row>
            )}
            <Row label="Mid-range left">
              <Num>
                {formatSignedHz(alignment.predictedMidTrackingHz)} ({formatNumber(alignment.predictedMidTrackingPercent, 4, true)} %)
              </Num>{' '}
              at <Num>{formatHz(alignment.midTargetHz)}</Num>
            </Row>
          </Box>
          <TextField
            label="Tuning capacitance at the low end"
            value={capText}
            onChange={(e) => setCapText(e.target.value)}
            sx={{ mt: 2 }}
            error={Boolean(withPf && 'error' in withPf)}
            helperText={withPf && 'error' in withPf ? withPf.error : 'Gives the trimmer move in pF'}
            slotProps={{
              input: { endAdornment: <InputAdornment position="end">pF</InputAdornment> },
              htmlInput: { inputMode: 'decimal', style: { fontFamily: numberSx.fontFamily } },
            }}
          />
        </>
      )}
    </Paper>
  );
}
