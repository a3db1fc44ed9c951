import Box from '@mui/material/Box';
import type { SxProps, Theme } from '@mui/material/styles';
import type { ReactNode } from 'react';
import { MONO_FONT } from '@/lib/theme';

/** Monospaced, tabular figures: columns of numbers line up digit under digit. */
export const numberSx = {
  fontFamily: MONO_FONT,
  fontVariantNumeric: 'tabular-nums',
  fontFeatureSettings: '"tnum" 1',
  whiteSpace: 'nowrap',
} as const;

type NumProps = {
  children: ReactNode;
  /** Right-align, as numbers in a table column should be. */
  align?: 'left' | 'right';
  sx?: SxProps<Theme>;
};

export function Num({ children, align, sx }: NumProps) {
  return (
    <Box component="span" sx={[numberSx, align === 'right' && { display: 'block', textAlign: 'right' }, ...(Array.isArray(sx) ? sx : [sx])]}>
      {children}
    </Box>
  );
}
