import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';

// A damped wave: the settling of an oscillator after power-on, which is much of what the lab measures.
export function Logo({ color = 'inherit' }: { color?: string }) {
  return (
    <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, color }}>
      <svg width="22" height="22" viewBox="0 0 32 32" aria-hidden focusable="false">
        <path d="M3 16c2.5-10 4.5-10 7 0s4.5 7 7 0 4.5-4 7 0 3 2 5 0" fill="none" stroke="#e3aa45" strokeWidth="3" strokeLinecap="round" />
      </svg>
      <Typography variant="h6" component="span" sx={{ fontWeight: 500, fontSize: '1.05rem', letterSpacing: '0.02em' }}>
        Kilocycle
      </Typography>
    </Box>
  );
}
