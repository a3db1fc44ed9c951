import type { ComparableRunKind, ComparisonQuantity } from '@kilocycle/common/types';

export type RowDefinition = {
  quantity: ComparisonQuantity;
  name: (withinHz: number) => string;
  unit: string;
  method: (windowSeconds: number, kind: ComparableRunKind) => string;
  kinds: readonly ComparableRunKind[];
};

const FIT = 'warm-up fit f(t) = f∞ + A·e^(−t/τ) by least squares on every included reading; standard error from s²·(JᵀJ)⁻¹, ν = n − 3';
const ADEV = (tau: number) =>
  `overlapping Allan deviation of the fractional frequency at τ = ${tau} s over the settled part (NIST SP 1065 Eq. 14; 95 % χ² interval with the white-FM edf); ` +
  'standard error σ/√(2·edf), ν = edf';

/** The comparison table's rows, in order, with how each value and its standard error are obtained. */
export const COMPARISON_ROWS: readonly RowDefinition[] = [
  { quantity: 'tau', name: () => 'time constant τ', unit: 's', method: () => FIT, kinds: ['warmup'] },
  { quantity: 'amplitude', name: () => 'warm-up amplitude A', unit: 'Hz', method: () => FIT, kinds: ['warmup'] },
  { quantity: 'fInf', name: () => 'settled frequency f∞', unit: 'Hz', method: () => FIT, kinds: ['warmup'] },
  {
    quantity: 'settledDriftRate',
    name: () => 'settled drift rate',
    unit: 'Hz/min',
    method: (w, kind) =>
      kind === 'stability'
        ? 'least-squares line on frequency over the longest continuous segment (NIST SP 1065 linear frequency drift), in Hz/min; standard error s/√Stt from the residual scatter, ν = n − 2 (assumes white FM: optimistic with flicker or random-walk FM)'
        : `mean of the least-squares drift rates of back-to-back ${w} s windows after the settling time; standard error s/√k, ν = k − 1 over the k windows`,
    kinds: ['warmup', 'stability'],
  },
  {
    quantity: 'settlingTime',
    name: (hz) => `settling time (within ${hz} Hz)`,
    unit: 's',
    method: () => 'τ·ln(|A|/N) from the warm-up fit; standard error by the delta method with the full τ–A covariance of the fit, ν = n − 3',
    kinds: ['warmup'],
  },
  { quantity: 'adev1s', name: () => 'Allan deviation at 1 s', unit: '', method: () => ADEV(1), kinds: ['warmup', 'stability'] },
  { quantity: 'adev10s', name: () => 'Allan deviation at 10 s', unit: '', method: () => ADEV(10), kinds: ['warmup', 'stability'] },
  { quantity: 'adev100s', name: () => 'Allan deviation at 100 s', unit: '', method: () => ADEV(100), kinds: ['warmup', 'stability'] },
];

export const ADEV_QUANTITY_TAU: Partial<Record<ComparisonQuantity, number>> = { adev1s: 1, adev10s: 10, adev100s: 100 };

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/** A power of ten (a multiple of 3) that puts a small ratio such as an Allan deviation in readable figures, e.g. 2.3e-9 → −9. */
export function engineeringExponent(value: number): number {
  if (!(value > 0) || !Number.isFinite(value)) return 0;
  return 3 * Math.floor(Math.log10(value) / 3);
}

/** "× 10⁻⁹" */
export function powerOfTenText(exponent: number): string {
  return `× 10${Array.from(String(exponent), (c) => SUPERSCRIPT[c] ?? c).join('')}`;
}
