import Chip from '@mui/material/Chip';

export function ActiveChip({ active }: { active: boolean }) {
  return (
    <Chip
      size="small"
      variant={active ? 'filled' : 'outlined'}
      color={active ? 'success' : 'default'}
      label={active ? 'Active' : 'Deactivated'}
      sx={{ height: 20, fontSize: '0.75rem' }}
    />
  );
}
