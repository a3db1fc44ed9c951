import { BadRequestException } from '@nestjs/common';
import { dialToNominal, MetrologyError, toleranceHz } from '@kilocycle/common/math';
import type { DialLaw, RangeInput, Tolerance } from '@kilocycle/common/types';

const FREQUENCY_UNITS = ['Hz', 'kHz', 'MHz'];
const MAX_TABLE_POINTS = 200;

const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const onlyKeys = (value: object, keys: string[]) => Object.keys(value).filter((k) => !keys.includes(k));

/**
 * What is wrong with one range beyond its field types (the DTO checks those), each message naming the
 * field as `ranges[i].field`. Empty when the range is sound.
 */
export function rangeProblems(range: RangeInput, index: number): string[] {
  const at = (field: string, message: string) => `ranges[${index}].${field}: ${message}`;
  const problems: string[] = [];
  if (!(range.dialMax > range.dialMin)) problems.push(at('dialMax', `must be greater than dialMin (${range.dialMin})`));
  if (!(range.freqMaxHz > range.freqMinHz)) problems.push(at('freqMaxHz', `must be greater than freqMinHz (${range.freqMinHz})`));
  if (new Set(range.multipliers).size !== range.multipliers.length) problems.push(at('multipliers', 'must not repeat a value'));

  const law = range.dialLaw as Partial<DialLaw> & Record<string, unknown>;
  if (law.kind === 'direct') {
    const extra = onlyKeys(law, ['kind', 'unit']);
    if (extra.length > 0) problems.push(at('dialLaw', `unexpected field ${extra.join(', ')}`));
    if (!FREQUENCY_UNITS.includes(law.unit as string)) problems.push(at('dialLaw.unit', `must be one of: ${FREQUENCY_UNITS.join(', ')}`));
    else if (range.dialUnit !== law.unit)
      problems.push(at('dialLaw.unit', `a direct-reading dial reads in its own unit: must equal dialUnit (${range.dialUnit})`));
  } else if (law.kind === 'table') {
    const extra = onlyKeys(law, ['kind', 'points']);
    if (extra.length > 0) problems.push(at('dialLaw', `unexpected field ${extra.join(', ')}`));
    const points = law.points as unknown;
    if (!Array.isArray(points) || points.length < 2 || points.length > MAX_TABLE_POINTS) {
      problems.push(at('dialLaw.points', `must be a list of 2 to ${MAX_TABLE_POINTS} {dial, frequency} points`));
    } else {
      points.forEach((p: unknown, i) => {
        const point = p as Record<string, unknown> | null;
        if (
          point === null ||
          typeof point !== 'object' ||
          onlyKeys(point, ['dial', 'frequency']).length > 0 ||
          !isFiniteNumber(point.dial) ||
          !isFiniteNumber(point.frequency) ||
          point.frequency <= 0
        ) {
          problems.push(at(`dialLaw.points[${i}]`, 'must be {dial: number, frequency: Hz above zero}'));
        }
      });
    }
  } else {
    problems.push(at('dialLaw.kind', "must be 'direct' or 'table'"));
  }
  if (range.dialUnit === 'div' && law.kind !== 'table') problems.push(at('dialLaw', 'a dial marked in divisions needs a table law'));

  const tolerance = range.tolerance as Partial<Tolerance> & Record<string, unknown>;
  if (tolerance.kind === 'percent') {
    if (onlyKeys(tolerance, ['kind', 'percent']).length > 0 || !isFiniteNumber(tolerance.percent) || tolerance.percent <= 0 || tolerance.percent > 100) {
      problems.push(at('tolerance', "a percent tolerance is {kind: 'percent', percent} with percent above 0 and at most 100"));
    }
  } else if (tolerance.kind === 'ppm_hz') {
    const { ppm, hz } = tolerance;
    if (onlyKeys(tolerance, ['kind', 'ppm', 'hz']).length > 0 || !isFiniteNumber(ppm) || !isFiniteNumber(hz) || ppm < 0 || hz < 0 || ppm + hz <= 0) {
      problems.push(at('tolerance', "a ppm + Hz tolerance is {kind: 'ppm_hz', ppm, hz}, both 0 or more and not both 0"));
    }
  } else {
    problems.push(at('tolerance.kind', "must be 'percent' or 'ppm_hz'"));
  }

  // The law must give a frequency at both dial ends; common's own checks say why not.
  if (problems.length === 0) {
    try {
      for (const dial of [range.dialMin, range.dialMax]) {
        const nominal = dialToNominal(range.dialLaw, dial);
        toleranceHz(range.tolerance, nominal);
      }
    } catch (error) {
      if (!(error instanceof MetrologyError)) throw error;
      problems.push(at('dialLaw', error.message));
    }
  }
  return problems;
}

/** Checks every range; 400 with one message per problem. */
export function assertRanges(ranges: readonly RangeInput[]): void {
  const problems = ranges.flatMap((range, index) => rangeProblems(range, index));
  const labels = ranges.map((r) => r.label.toLowerCase());
  labels.forEach((label, index) => {
    if (labels.indexOf(label) !== index) problems.push(`ranges[${index}].label: "${ranges[index]!.label}" is used by another range of this instrument`);
  });
  if (problems.length > 0) throw new BadRequestException(problems);
}

/** The fields that define what a range's readings mean; fixed once a run uses the range. */
export function measurementFieldsDiffer(a: RangeInput, b: RangeInput): string[] {
  const fields = ['dialUnit', 'dialLaw', 'dialMin', 'dialMax', 'tolerance'] as const;
  return fields.filter((f) => canonical(a[f]) !== canonical(b[f]));
}

// JSON with sorted keys: a law read back from a JSON column may list its keys in another order.
function canonical(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v !== null && typeof v === 'object' && !Array.isArray(v)
      ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([x], [y]) => x.localeCompare(y)))
      : v,
  );
}
