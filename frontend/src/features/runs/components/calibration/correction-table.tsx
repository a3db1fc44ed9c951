import Box from '@mui/material/Box';
import Paper from '@mui/material/Paper';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useMemo, useState } from 'react';
import { dialForFrequencyEstimate, MetrologyError } from '@kilocycle/common/math';
import type { CalibrationRunAnalysis, FrequencyUnit } from '@kilocycle/common/types';
import { parseFrequency } from '@kilocycle/common/units';
import { Num, numberSx } from '@/components/ui/num';
import { HIDE_ON_PHONE, PhoneSecondLine } from '@/components/ui/phone-columns';
import { formatHz, formatNumber } from '@/utils/frequency';

function dialDecimals(values: readonly number[]) {
  return Math.min(4, Math.max(0, ...values.map((v) => (Number.isInteger(v) ? 0 : (String(v).split('.')[1]?.length ?? 0)))));
}

/** The correction at each measured setting, and the inverse: which dial setting gives a wanted frequency. */
export function CorrectionTable({ analysis }: { analysis: CalibrationRunAnalysis }) {
  const [wanted, setWanted] = useState('');
  const unit: FrequencyUnit = analysis.range.dialUnit === 'div' ? 'Hz' : analysis.range.dialUnit;
  const rows = analysis.corrections;
  const decimals = dialDecimals(rows.map((r) => r.dial));
  const perUnit = unit === 'MHz' ? 1e6 : unit === 'kHz' ? 1e3 : 1;
  const unitDecimals = unit === 'MHz' ? 6 : unit === 'kHz' ? 3 : 0;

  const inverse = useMemo(() => {
    if (!wanted.trim()) return null;
    try {
      const hz = parseFrequency(wanted, unit);
      const { dialMin, dialMax, dialUnit } = analysis.range;
      try {
        const estimate = dialForFrequencyEstimate(analysis.points, hz, { min: dialMin, max: dialMax });
        const text = `Set the dial to ${formatNumber(estimate.dial, decimals + 2)} ${dialUnit} for ${formatHz(hz)}`;
        if (!estimate.extrapolated) return { ok: true as const, text };
        // Beyond the measured settings the figure is the end segment's line carried on: say so.
        const measured = `${formatNumber(estimate.measuredFrom, decimals)} to ${formatNumber(estimate.measuredTo, decimals)} ${dialUnit}`;
        return { ok: true as const, text: `${text}, extrapolated beyond the settings measured (dial ${measured})` };
      } catch (error) {
        if (error instanceof MetrologyError && error.code === 'outside_span') {
          return {
            ok: false as const,
            text: `${formatHz(hz)} lies beyond this range’s dial (${formatNumber(dialMin, decimals)} to ${formatNumber(dialMax, decimals)} ${dialUnit})`,
          };
        }
        throw error;
      }
    } catch (error) {
      return { ok: false as const, text: error instanceof Error ? error.message : String(error) };
    }
  }, [wanted, unit, analysis.points, analysis.range, decimals]);

  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Corrections
      </Typography>
      {/* The scrolling box below takes the keyboard focus, so it scrolls with the arrow keys too (WCAG 2.1.1). */}
      {rows.length === 0 ? (
        <Typography variant="body2" color="text.secondary">
          None yet.
        </Typography>
      ) : (
        <Box tabIndex={0} role="region" aria-label="Corrections, scrollable" sx={{ maxHeight: 300, overflow: 'auto' }}>
          <Table size="small" stickyHeader aria-label="Correction table">
            <TableHead>
              <TableRow>
                <TableCell align="right">Dial ({analysis.range.dialUnit})</TableCell>
                <TableCell align="right" sx={HIDE_ON_PHONE}>
                  Nominal ({unit})
                </TableCell>
                <TableCell align="right">Measured ({unit})</TableCell>
                <TableCell align="right">Correction (Hz)</TableCell>
              </TableRow>
            </TableHead>
            <TableBody>
              {rows.map((row) => (
                <TableRow key={row.dial}>
                  <TableCell align="right">
                    <Num>{formatNumber(row.dial, decimals)}</Num>
                    {/* On a phone the nominal frequency reads under the dial setting. */}
                    <PhoneSecondLine parts={[`nominal ${formatNumber(row.nominal / perUnit, unitDecimals)} ${unit}`]} />
                  </TableCell>
                  <TableCell align="right" sx={HIDE_ON_PHONE}>
                    <Num>{formatNumber(row.nominal / perUnit, unitDecimals)}</Num>
                  </TableCell>
                  <TableCell align="right">
                    <Num>{formatNumber(row.measured / perUnit, unitDecimals + 1)}</Num>
                  </TableCell>
                  <TableCell align="right">
                    <Num>{formatNumber(row.correctionHz, 1, true)}</Num>
                  </TableCell>
                </TableRow>
              ))}
            </TableBody>
          </Table>
        </Box>
      )}
      <TextField
        label="Dial for frequency"
        placeholder={unit === 'Hz' ? '1 735 000' : `e.g. 1 862.5 ${unit}`}
        value={wanted}
        onChange={(e) => setWanted(e.target.value)}
        sx={{ mt: 2 }}
        error={inverse !== null && !inverse.ok}
        helperText={inverse?.text ?? 'A wanted frequency: the dial setting that gives it, from the measured points (marked when extrapolated beyond them)'}
        slotProps={{ htmlInput: { style: { fontFamily: numberSx.fontFamily } } }}
      />
    </Paper>
  );
}
