import Box from '@mui/material/Box';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ComponentDistribution, PointBudget } from '@kilocycle/common/types';
import { numberSx } from '@/components/ui/num';
import { formatNumber, formatSignificant } from '@/utils/frequency';
import { formatCompact } from '@/utils/measurement';
import { formatUncertainty } from '../utils/results-format';

const DISTRIBUTION_LABELS: Record<ComponentDistribution, string> = {
  normal: 'Normal',
  rectangular: 'Rectangular',
  triangular: 'Triangular',
  u_shaped: 'U-shaped',
};

const num = { ...numberSx, fontSize: '0.8125rem', textAlign: 'right' } as const;

function dof(value: number | null): string {
  if (value === null || !Number.isFinite(value) || value > 1e6) return '∞';
  return value >= 100 || Number.isInteger(value) ? formatNumber(value, 0) : formatSignificant(value, 3);
}

/** The uncertainty budget behind one result (GUM): each component, then u_c, ν_eff, k and U. */
export function BudgetTable({ budget, caption }: { budget: PointBudget; caption: string }) {
  const share = (contribution: number) => (budget.ucHz > 0 ? (contribution * contribution) / (budget.ucHz * budget.ucHz) : 0);
  return (
    <Box sx={{ overflowX: 'auto' }}>
      <Table size="small" aria-label={caption} sx={{ '& td, & th': { py: 0.5, px: 1 } }}>
        <TableHead>
          <TableRow>
            <TableCell>Component</TableCell>
            <TableCell>Type</TableCell>
            <TableCell>Distribution</TableCell>
            <TableCell sx={{ textAlign: 'right' }}>Value</TableCell>
            <TableCell sx={{ textAlign: 'right' }}>Divisor</TableCell>
            <TableCell sx={{ textAlign: 'right' }}>Sensitivity c</TableCell>
            <TableCell sx={{ textAlign: 'right' }}>Standard uncertainty u</TableCell>
            <TableCell sx={{ textAlign: 'right' }}>|c|·u (Hz)</TableCell>
            <TableCell sx={{ textAlign: 'right' }}>Share of u²</TableCell>
            <TableCell sx={{ textAlign: 'right' }}>ν</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {budget.lines.map((line) => (
            <TableRow key={line.name}>
              <TableCell>{line.name}</TableCell>
              <TableCell>{line.kind}</TableCell>
              <TableCell>{DISTRIBUTION_LABELS[line.distribution]}</TableCell>
              <TableCell sx={num}>
                {line.distribution === 'normal' ? '' : '±'}
                {formatCompact(line.value, 4)} {line.unit}
              </TableCell>
              <TableCell sx={num}>{line.divisor === 1 ? '1' : formatCompact(line.divisor, 4)}</TableCell>
              <TableCell sx={num}>
                {formatCompact(line.sensitivity, 4)}
                {line.unit !== 'Hz' ? ` Hz/${line.unit}` : ''}
              </TableCell>
              <TableCell sx={num}>
                {formatSignificant(line.standardUncertainty, 3)} {line.unit}
              </TableCell>
              <TableCell sx={num}>{formatSignificant(line.contributionHz, 3)}</TableCell>
              <TableCell sx={num}>{(share(line.contributionHz) * 100).toFixed(1)} %</TableCell>
              <TableCell sx={num}>{dof(line.dof)}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
      <Box
        component="dl"
        sx={{
          display: 'grid',
          gridTemplateColumns: 'repeat(auto-fill, minmax(180px, 1fr))',
          gap: 1,
          m: 0,
          mt: 1.5,
          '& dt': { color: 'text.secondary', fontSize: '0.75rem' },
          '& dd': { m: 0, ...numberSx, fontSize: '0.95rem' },
        }}
      >
        <div>
          <dt>
            Combined standard uncertainty u<sub>c</sub>
          </dt>
          <dd>{formatSignificant(budget.ucHz, 3)} Hz</dd>
        </div>
        <div>
          <dt>
            Effective degrees of freedom ν<sub>eff</sub>
          </dt>
          <dd>{dof(budget.nuEff)}</dd>
        </div>
        <div>
          <dt>Coverage factor k</dt>
          <dd>{budget.k.toFixed(2)}</dd>
        </div>
        <div>
          <dt>Expanded uncertainty U (≈{Math.round(budget.coverage * 100)} %)</dt>
          <dd>{formatUncertainty(budget.U)}</dd>
        </div>
      </Box>
      {budget.notes.length > 0 && (
        <Box component="ul" sx={{ mt: 1, mb: 0, pl: 2.5 }}>
          {budget.notes.map((note) => (
            <Typography component="li" variant="body2" color="text.secondary" key={note}>
              {note}
            </Typography>
          ))}
        </Box>
      )}
    </Box>
  );
}
