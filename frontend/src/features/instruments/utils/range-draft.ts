import { parseFrequency, parseNumber } from '@kilocycle/common/units';
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

export type RangeDraftErrors = Partial<Record<keyof RangeDraft | `table.${number}`, string>>;

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
    table:
      range.dialLaw.kind === 'table'
        ? range.dialLaw.points.map((p) => ({ dial: String(p.dial), frequency: plain(p.frequency) }))
        : EMPTY_RANGE.table,
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

function messageOf(error: unknown) {
  return error instanceof Error ? error.message : String(error);
}

/** Reads a draft into what the API takes, or says field by field what is wrong. */
export function fromDraft(draft: RangeDraft): { range: RangeInput | null; errors: RangeDraftErrors } {
  const errors: RangeDraftErrors = {};
  const unit = frequencyUnitOf(draft.dialUnit);
  const number = (field: keyof RangeDraft, text: string): number => {
    try {
      return parseNumber(text);
    } catch (error) {
      errors[field] = messageOf(error);
      return NaN;
    }
  };
  const frequency = (field: keyof RangeDraft | `table.${number}`, text: string): number => {
    try {
      return parseFrequency(text, unit);
    } catch (error) {
      errors[field] = messageOf(error);
      return NaN;
    }
  };

  if (!draft.label.trim()) errors.label = 'Give the range a label, as marked on the switch';
  const dialMin = number('dialMin', draft.dialMin);
  const dialMax = number('dialMax', draft.dialMax);
  if (!errors.dialMin && !errors.dialMax && !(dialMax > dialMin)) errors.dialMax = 'The dial’s top must be above its bottom';
  const freqMinHz = frequency('freqMin', draft.freqMin);
  const freqMaxHz = frequency('freqMax', draft.freqMax);
  if (!errors.freqMin && !errors.freqMax && !(freqMaxHz > freqMinHz)) errors.freqMax = 'The top frequency must be above the bottom one';

  if (draft.dialUnit === 'div' && draft.lawKind === 'direct') errors.lawKind = 'A dial in divisions needs a table of dial and frequency';
  const points = draft.table.map((row, index) => {
    let dial = NaN;
    try {
      dial = parseNumber(row.dial);
    } catch (error) {
      errors[`table.${index}`] = `dial: ${messageOf(error)}`;
    }
    const hz = frequency(`table.${index}`, row.frequency);
    return { dial, frequency: hz };
  });
  if (draft.lawKind === 'table' && points.length < 2) errors.lawKind = 'A table needs at least two points';

  let tolerance: RangeInput['tolerance'];
  if (draft.toleranceKind === 'percent') {
    const percent = number('percent', draft.percent);
    if (!errors.percent && !(percent > 0 && percent <= 100)) errors.percent = 'Above 0 and at most 100 %';
    tolerance = { kind: 'percent', percent };
  } else {
    const ppm = draft.ppm.trim() === '' ? 0 : number('ppm', draft.ppm);
    const hz = draft.hz.trim() === '' ? 0 : number('hz', draft.hz);
    if (!errors.ppm && !errors.hz && (ppm < 0 || hz < 0 || ppm + hz <= 0)) errors.ppm = 'Both 0 or more, and not both 0';
    tolerance = { kind: 'ppm_hz', ppm, hz };
  }

  const multipliers = draft.multipliers
    .split(/[\s,;×x]+/)
    .filter(Boolean)
    .map(Number);
  if (multipliers.length === 0 || multipliers.some((m) => !Number.isInteger(m) || m < 1 || m > 64))
    errors.multipliers = 'Whole numbers from 1 to 64, separated by commas (1, 2, 4)';
  else if (new Set(multipliers).size !== multipliers.length) errors.multipliers = 'Each multiplier once';

  if (Object.keys(errors).length > 0) return { range: null, errors };
  return {
    errors,
    range: {
      ...(draft.id ? { id: draft.id } : {}),
      label: draft.label.trim(),
      dialUnit: draft.dialUnit,
      dialLaw: draft.lawKind === 'direct' && isFrequencyUnit(draft.dialUnit) ? { kind: 'direct', unit: draft.dialUnit } : { kind: 'table', points },
      dialMin,
      dialMax,
      freqMinHz,
      freqMaxHz,
      tolerance,
      multipliers,
    },
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
