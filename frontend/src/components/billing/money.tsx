import type { SxProps, Theme } from '@mui/material/styles';
import { formatMoney } from '@kilocycle/common/money';
import { Num } from '@/components/ui/num';

type MoneyProps = {
  /** Integer minor units, as the server sends them. */
  minor: number;
  currency: string;
  align?: 'left' | 'right';
  sx?: SxProps<Theme>;
};

/** An amount of money as the server gave it, printed with common's formatMoney in the figures' font. */
export function Money({ minor, currency, align, sx }: MoneyProps) {
  return (
    <Num align={align} sx={sx}>
      {formatMoney(minor, currency)}
    </Num>
  );
}
