import { useMutation, useQueryClient } from '@tanstack/react-query';
import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { DIAL_UNITS, type Instrument, type RangeInput, type UpdateInstrumentRequest } from '@kilocycle/common/types';
import { parseFrequency, parseNumber } from '@kilocycle/common/units';
import { z } from 'zod';
import { api } from '@/lib/api-client';
import { frequencyUnitOf } from '../utils/range-draft';
import { getInstrumentQueryOptions } from './get-instrument';
import { getInstrumentsQueryOptions } from './get-instruments';

const RANGE = FIELD_LIMITS.range;

function messageOf(error: unknown) {
  return error instanceof Error ? error.message : String(error);
}

/** The range form (the editor's RangeDraft, every number as typed) read into what the API takes, field by field. */
export const rangeDraftSchema = z
  .object({
    id: z.number().optional(),
    label: z.string().trim().min(1, 'Give the range a label, as marked on the switch').max(RANGE.label.max, `At most ${RANGE.label.max} characters`),
    dialUnit: z.enum(DIAL_UNITS),
    lawKind: z.enum(['direct', 'table']),
    table: z.array(z.object({ dial: z.string(), frequency: z.string() })),
    dialMin: z.string(),
    dialMax: z.string(),
    freqMin: z.string(),
    freqMax: z.string(),
    toleranceKind: z.enum(['percent', 'ppm_hz']),
    percent: z.string(),
    ppm: z.string(),
    hz: z.string(),
    multipliers: z.string(),
  })
  .transform((draft, context): RangeInput => {
    let refused = false;
    const refuse = (path: (string | number)[], message: string) => {
      refused = true;
      context.addIssue({ code: 'custom', path, message });
    };
    const read = (path: (string | number)[], parse: () => number, prefix = '') => {
      try {
        return parse();
      } catch (error) {
        refuse(path, `${prefix}${messageOf(error)}`);
        return NaN;
      }
    };
    const unit = frequencyUnitOf(draft.dialUnit);
    const number = (field: 'dialMin' | 'dialMax' | 'percent' | 'ppm' | 'hz') => read([field], () => parseNumber(draft[field]));
    const frequency = (field: 'freqMin' | 'freqMax') => read([field], () => parseFrequency(draft[field], unit));

    const dialMin = number('dialMin');
    const dialMax = number('dialMax');
    if (Number.isFinite(dialMin) && Number.isFinite(dialMax) && !(dialMax > dialMin)) refuse(['dialMax'], 'The dial’s top must be above its bottom');
    const freqMinHz = frequency('freqMin');
    const freqMaxHz = frequency('freqMax');
    if (Number.isFinite(freqMinHz) && Number.isFinite(freqMaxHz) && !(freqMaxHz > freqMinHz))
      refuse(['freqMax'], 'The top frequency must be above the bottom one');

    if (draft.dialUnit === 'div' && draft.lawKind === 'direct') refuse(['lawKind'], 'A dial in divisions needs a table of dial and frequency');
    const points = draft.table.map((row, index) => ({
      dial: read(['table', index, 'frequency'], () => parseNumber(row.dial), 'dial: '),
      frequency: read(['table', index, 'frequency'], () => parseFrequency(row.frequency, unit)),
    }));
    if (draft.lawKind === 'table' && points.length < 2) refuse(['lawKind'], 'A table needs at least two points');

    let tolerance: RangeInput['tolerance'];
    if (draft.toleranceKind === 'percent') {
      const percent = number('percent');
      if (Number.isFinite(percent) && !(percent > 0 && percent <= 100)) refuse(['percent'], 'Above 0 and at most 100 %');
      tolerance = { kind: 'percent', percent };
    } else {
      const ppm = draft.ppm.trim() === '' ? 0 : number('ppm');
      const hz = draft.hz.trim() === '' ? 0 : number('hz');
      if (Number.isFinite(ppm) && Number.isFinite(hz) && (ppm < 0 || hz < 0 || ppm + hz <= 0)) refuse(['ppm'], 'Both 0 or more, and not both 0');
      tolerance = { kind: 'ppm_hz', ppm, hz };
    }

    const multipliers = draft.multipliers
      .split(/[\s,;×x]+/)
      .filter(Boolean)
      .map(Number);
    if (multipliers.length === 0 || multipliers.some((m) => !Number.isInteger(m) || m < 1 || m > RANGE.multiplier.max))
      refuse(['multipliers'], `Whole numbers from 1 to ${RANGE.multiplier.max}, separated by commas (1, 2, 4)`);
    else if (new Set(multipliers).size !== multipliers.length) refuse(['multipliers'], 'Each multiplier once');

    if (refused) return z.NEVER;
    return {
      ...(draft.id ? { id: draft.id } : {}),
      label: draft.label,
      dialUnit: draft.dialUnit,
      dialLaw: draft.lawKind === 'direct' && draft.dialUnit !== 'div' ? { kind: 'direct', unit: draft.dialUnit } : { kind: 'table', points },
      dialMin,
      dialMax,
      freqMinHz,
      freqMaxHz,
      tolerance,
      multipliers,
    };
  });

export type UpdateInstrumentInput = { id: number; changes: UpdateInstrumentRequest };

export function updateInstrument({ id, changes }: UpdateInstrumentInput): Promise<Instrument> {
  return api.patch<Instrument>(`/instruments/${id}`, changes, { notify: false });
}

export function useUpdateInstrument({ onSuccess }: { onSuccess?: (instrument: Instrument) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateInstrument,
    onSuccess: async (instrument) => {
      queryClient.setQueryData(getInstrumentQueryOptions(instrument.id).queryKey, instrument);
      await queryClient.invalidateQueries({ queryKey: getInstrumentsQueryOptions().queryKey });
      onSuccess?.(instrument);
    },
  });
}
