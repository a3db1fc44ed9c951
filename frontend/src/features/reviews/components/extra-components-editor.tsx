import AddOutlined from '@mui/icons-material/AddOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import { COMPONENT_DISTRIBUTIONS, type ComponentDistribution, type ExtraComponent } from '@kilocycle/common/types';

import type { ExtraComponentDraft } from '../api/save-procedure';

export type { ExtraComponentDraft };

const DISTRIBUTION_LABELS: Record<ComponentDistribution, string> = {
  normal: 'Normal (quoted U with its k)',
  rectangular: 'Rectangular (half-width)',
  triangular: 'Triangular (half-width)',
  u_shaped: 'U-shaped (half-width)',
};

export function toDrafts(components: readonly ExtraComponent[]): ExtraComponentDraft[] {
  return components.map((c) => ({
    name: c.name,
    distribution: c.distribution,
    value: String(c.value),
    unit: c.unit,
    divisor: c.divisor === undefined ? '' : String(c.divisor),
    dof: c.dof === undefined || c.dof === null ? '' : String(c.dof),
  }));
}

const EMPTY: ExtraComponentDraft = { name: '', distribution: 'rectangular', value: '', unit: 'Hz', divisor: '', dof: '' };

type ExtraComponentsEditorProps = {
  value: ExtraComponentDraft[];
  onChange: (value: ExtraComponentDraft[]) => void;
  disabled?: boolean;
  /** The form's refusal of a row ("Extra component 2: …"). */
  error?: string;
};

/** Budget lines beyond the standard six (cabling, loading…), each with its distribution and size. */
export function ExtraComponentsEditor({ value, onChange, disabled, error }: ExtraComponentsEditorProps) {
  const set = (index: number, changes: Partial<ExtraComponentDraft>) => onChange(value.map((d, i) => (i === index ? { ...d, ...changes } : d)));
  return (
    <Box>
      {error && (
        <Typography variant="body2" color="error" role="alert" sx={{ mb: 1 }}>
          {error}
        </Typography>
      )}
      {value.length === 0 && (
        <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
          No extra components.
        </Typography>
      )}
      {value.map((d, index) => (
        <Box
          key={index}
          sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr', sm: '2fr 1.6fr 0.9fr 0.8fr 0.8fr 0.7fr auto' }, gap: 1, mb: 1, alignItems: 'start' }}
        >
          <TextField label="Component" value={d.name} onChange={(e) => set(index, { name: e.target.value })} disabled={disabled} />
          <TextField
            select
            label="Distribution"
            value={d.distribution}
            onChange={(e) => set(index, { distribution: e.target.value as ComponentDistribution })}
            disabled={disabled}
          >
            {COMPONENT_DISTRIBUTIONS.map((dist) => (
              <MenuItem key={dist} value={dist}>
                {DISTRIBUTION_LABELS[dist]}
              </MenuItem>
            ))}
          </TextField>
          <TextField label="Value" inputMode="decimal" value={d.value} onChange={(e) => set(index, { value: e.target.value })} disabled={disabled} />
          <TextField select label="Unit" value={d.unit} onChange={(e) => set(index, { unit: e.target.value as 'Hz' | 'ppm' })} disabled={disabled}>
            <MenuItem value="Hz">Hz</MenuItem>
            <MenuItem value="ppm">ppm</MenuItem>
          </TextField>
          <TextField
            label="k"
            inputMode="decimal"
            placeholder="1"
            value={d.divisor}
            onChange={(e) => set(index, { divisor: e.target.value })}
            disabled={disabled || d.distribution !== 'normal'}
          />
          <TextField label="ν" inputMode="numeric" placeholder="∞" value={d.dof} onChange={(e) => set(index, { dof: e.target.value })} disabled={disabled} />
          <IconButton aria-label={`Remove extra component ${index + 1}`} onClick={() => onChange(value.filter((_, i) => i !== index))} disabled={disabled}>
            <DeleteOutlined fontSize="small" />
          </IconButton>
        </Box>
      ))}
      <Button size="small" startIcon={<AddOutlined />} onClick={() => onChange([...value, { ...EMPTY }])} disabled={disabled}>
        Add a component
      </Button>
    </Box>
  );
}
