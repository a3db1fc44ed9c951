import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';

export type FilterOption = { value: string; label: string };

type SelectFilterProps = {
  label: string;
  value: string;
  options: readonly FilterOption[];
  onChange: (value: string) => void;
  allLabel?: string;
  minWidth?: number;
};

/** A compact select whose empty value means "no filter". */
export function SelectFilter({ label, value, options, onChange, allLabel = 'All', minWidth = 160 }: SelectFilterProps) {
  return (
    <TextField
      select
      label={label}
      value={options.some((o) => o.value === value) ? value : ''}
      onChange={(event) => onChange(event.target.value)}
      fullWidth={false}
      sx={{ minWidth }}
      slotProps={{ select: { displayEmpty: true }, inputLabel: { shrink: true } }}
    >
      <MenuItem value="">{allLabel}</MenuItem>
      {options.map((option) => (
        <MenuItem key={option.value} value={option.value}>
          {option.label}
        </MenuItem>
      ))}
    </TextField>
  );
}
