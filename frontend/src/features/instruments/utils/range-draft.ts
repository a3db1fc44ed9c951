import type { DialUnit, FrequencyUnit, InstrumentRange, RangeInput } from '@kilocycle/common/types';
import { formatHz, formatNumber } from '@/utils/frequency';

/** A range as the editor holds it: every number as the text typed, so nothing is lost while typing. */
export type RangeDraft = {
  id?: number;
  label: string;
  dialUnit: DialUnit;
  lawKind: 'direct' | 'table';
  table: Array<{ dial: string; frequency: string }>;
  dialMin: string;
  dialMax: string;
  freqMin: string;
  freqMax: string;
  toleranceKind: 'percent' | 'ppm_hz';
  percent: string;
  ppm: string;
  hz: string;
  multipliers: string;
};

const isFrequencyUnit = (unit: DialUnit): unit is FrequencyUnit => unit !== 'div';

/** The unit a bare number in a frequency field is read in: the dial's own, or Hz for a dial in divisions. */
export function frequencyUnitOf(unit: DialUnit): FrequencyUnit {
  return isFrequencyUnit(unit) ? unit : 'Hz';
}

export const EMPTY_RANGE: RangeDraft = {
  label: '',
  dialUnit: 'kHz',
  lawKind: 'direct',
  table: [
    { dial: '', frequency: '' },
    { dial: '', frequency: '' },
  ],
  dialMin: '',
  dialMax: '',
  freqMin: '',
  freqMax: '',
  toleranceKind: 'percent',
  percent: '0.5',
  ppm: '',
  hz: '',
  multipliers: '1',
};

export function toDraft(range: InstrumentRange): RangeDraft {
  const unit = frequencyUnitOf(range.dialUnit);
  const plain = (hz: number) => formatHz(hz, unit, unit === 'Hz' ? 1 : unit === 'kHz' ? 3 : 6);
  return {
    id: range.id,
    label: range.label,
    dialUnit: range.dialUnit,
    lawKind: range.dialLaw.kind,
    table: range.dialLaw.kind === 'table' ? range.dialLaw.points.map((p) => ({ dial: String(p.dial), frequency: plain(p.frequency) })) : EMPTY_RANGE.table,
    dialMin: String(range.dialMin),
    dialMax: String(range.dialMax),
    freqMin: plain(range.freqMinHz),
    freqMax: plain(range.freqMaxHz),
    toleranceKind: range.tolerance.kind,
    percent: range.tolerance.kind === 'percent' ? String(range.tolerance.percent) : '',
    ppm: range.tolerance.kind === 'ppm_hz' ? String(range.tolerance.ppm) : '',
    hz: range.tolerance.kind === 'ppm_hz' ? String(range.tolerance.hz) : '',
    multipliers: range.multipliers.join(', '),
  };
}

/** The range's tolerance as people write it: `±0.5 % of setting`, `±(10 ppm + 1 Hz)`. */
export function describeTolerance(tolerance: RangeInput['tolerance']): string {
  if (tolerance.kind === 'percent') return `±${formatNumber(tolerance.percent, tolerance.percent < 0.1 ? 3 : 2)} % of setting`;
  return `±(${tolerance.ppm} ppm + ${tolerance.hz} Hz)`;
}

/** The dial span with its unit: `1 750 – 2 000 kHz`, `0 – 100 div`. */
export function describeDialSpan(range: Pick<InstrumentRange, 'dialMin' | 'dialMax' | 'dialUnit'>): string {
  const decimals = (v: number) => (Number.isInteger(v) ? 0 : Math.min(6, String(v).split('.')[1]?.length ?? 0));
  const d = Math.max(decimals(range.dialMin), decimals(range.dialMax));
  return `${formatNumber(range.dialMin, d)} – ${formatNumber(range.dialMax, d)} ${range.dialUnit}`;
}
