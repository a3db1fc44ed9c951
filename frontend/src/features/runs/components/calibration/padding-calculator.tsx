import Box from '@mui/material/Box';
import InputAdornment from '@mui/material/InputAdornment';
import Paper from '@mui/material/Paper';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { frequencyWithPadder, paddingForShift } from '@kilocycle/common/math';
import type { FrequencyUnit } from '@kilocycle/common/types';
import { parseFrequency, parseNumber } from '@kilocycle/common/units';
import { Num, numberSx } from '@/components/ui/num';
import { formatHz, formatNumber } from '@/utils/frequency';
import { SafetyCaution } from '@/components/ui/safety-caution';

const mono = { style: { fontFamily: numberSx.fontFamily } };

type Outcome = { ok: true; value: string } | { ok: false; value: string } | null;

function attempt(compute: () => string): Outcome {
  try {
    return { ok: true, value: compute() };
  } catch (error) {
    return { ok: false, value: error instanceof Error ? error.message : String(error) };
  }
}

/** Parallel capacitance that moves a range from f1 to f2, and where a given padder puts it. */
export function PaddingCalculator({ unit = 'kHz' }: { unit?: FrequencyUnit }) {
  const [f1, setF1] = useState('');
  const [f2, setF2] = useState('');
  const [cap, setCap] = useState('');
  const [padder, setPadder] = useState('');

  const ready = f1.trim() && cap.trim();
  const shift: Outcome =
    ready && f2.trim()
      ? attempt(() => `${formatNumber(paddingForShift(parseFrequency(f1, unit), parseFrequency(f2, unit), parseNumber(cap)), 2, true)} pF in parallel`)
      : null;
  const padded: Outcome =
    ready && padder.trim() ? attempt(() => `gives ${formatHz(frequencyWithPadder(parseFrequency(f1, unit), parseNumber(cap), parseNumber(padder)))}`) : null;

  const pf = { endAdornment: <InputAdornment position="end">pF</InputAdornment> };
  return (
    <Paper variant="outlined" sx={{ p: 2 }}>
      <Typography variant="h3" component="h2" sx={{ mb: 1 }}>
        Padding calculator
      </Typography>
      <Box sx={{ mb: 1.5 }}>
        <SafetyCaution compact>Fit or change a padder with the set switched off, unplugged and its capacitors discharged.</SafetyCaution>
      </Box>
      <Box sx={{ display: 'grid', gridTemplateColumns: '1fr 1fr', gap: 1.5 }}>
        <TextField label="Frequency now (f1)" value={f1} onChange={(e) => setF1(e.target.value)} slotProps={{ htmlInput: mono }} />
        <TextField label="Wanted (f2)" value={f2} onChange={(e) => setF2(e.target.value)} slotProps={{ htmlInput: mono }} />
        <TextField label="Tuning capacitance" value={cap} onChange={(e) => setCap(e.target.value)} slotProps={{ input: pf, htmlInput: mono }} />
        <TextField label="Padder to try" value={padder} onChange={(e) => setPadder(e.target.value)} slotProps={{ input: pf, htmlInput: mono }} />
      </Box>
      <Box sx={{ mt: 1.5, minHeight: 44 }}>
        {shift && (
          <Typography variant="body2" color={shift.ok ? 'text.primary' : 'error'}>
            f1 → f2: <Num>{shift.value}</Num>
          </Typography>
        )}
        {padded && (
          <Typography variant="body2" color={padded.ok ? 'text.primary' : 'error'}>
            Padder: <Num>{padded.value}</Num>
          </Typography>
        )}
        {!shift && !padded && (
          <Typography variant="body2" color="text.secondary">
            Bare numbers are read in {unit}; a negative result means capacitance to take out.
          </Typography>
        )}
      </Box>
    </Paper>
  );
}
