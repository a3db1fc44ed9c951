import { DISTRIBUTION_DIVISORS, type UncertaintyComponent } from './combine-uncertainty.js';
import { assertFinite, assertNonNegative, assertPositive } from './guards.js';
import { summariseSample } from './welch-difference.js';
import { MetrologyError } from './metrology-error.js';

export type FrequencyBudgetInput = {
  /** Nominal frequency of the point, Hz. */
  nominalHz: number;
  /** Counter readings at this point, Hz. */
  measuredSamples: readonly number[];
  /** Reference standard's time-base accuracy, ± ppm (half-width, rectangular). */
  standardAccuracyPpm: number;
  /** Counter resolution: ± one count in the last digit, Hz (half-width, rectangular). */
  counterResolutionHz: number;
  /** Half a dial division (the reading resolution), in dial divisions. */
  dialHalfDivision: number;
  /** Local slope of the dial, df/d(dial), Hz per division. */
  dialSlopeHzPerDiv: number;
  /** Drift during the measurement, ± Hz (half-width, rectangular). */
  driftHz: number;
  /** Expanded uncertainty on the standard's own certificate, Hz. */
  standardCalUHz: number;
  /** Coverage factor quoted with it. */
  standardCalK: number;
};

/**
 * The uncertainty budget of one calibration point (PRODUCT §5.6), as components for
 * {@link combineUncertainty}; the measurand is the frequency the setting produces, in Hz:
 * 1. time-base accuracy of the standard: ±ppm·10⁻⁶·nominal, rectangular (÷√3), Type B;
 * 2. counter resolution, ±1 count: rectangular (÷√3), Type B;
 * 3. repeatability: s/√n of the readings, normal, Type A, ν = n − 1 (GUM 4.2.3) — only
 *    with two or more readings; with one reading it is left out and `notes` says so;
 * 4. dial reading resolution: ± half a division, rectangular (÷√3), sensitivity = local
 *    slope df/d(dial) in Hz per division, Type B;
 * 5. drift during the measurement: ±Hz, rectangular (÷√3), Type B;
 * 6. calibration of the standard: U/k from its certificate, normal, Type B.
 * Type B components have infinite degrees of freedom. Zero-valued Type B lines are kept
 * (they show that the item was considered).
 *
 * @param input the point's nominal, readings and the lab's figures
 * @returns components and notes
 * @throws {MetrologyError} 'bad_frequency' (nominal ≤ 0), 'too_few_points' (no readings),
 *   'not_finite', 'bad_argument' (negative half-widths, k ≤ 0)
 * @example frequencyBudget({ nominalHz: 7e6, measuredSamples: [7_000_012, 7_000_013], standardAccuracyPpm: 0.1,
 *   counterResolutionHz: 1, dialHalfDivision: 0.5, dialSlopeHzPerDiv: 1000, driftHz: 2, standardCalUHz: 0.2, standardCalK: 2 });
 */
export function frequencyBudget(input: FrequencyBudgetInput): { components: UncertaintyComponent[]; notes: string[] } {
  const fn = 'frequencyBudget';
  assertPositive(fn, 'the nominal frequency', input.nominalHz, 'bad_frequency');
  if (!Array.isArray(input.measuredSamples) || input.measuredSamples.length === 0) {
    throw new MetrologyError('too_few_points', `${fn} requires at least 1 data point (reading)`);
  }
  assertNonNegative(fn, 'the standard accuracy (ppm)', input.standardAccuracyPpm);
  assertNonNegative(fn, 'the counter resolution', input.counterResolutionHz);
  assertNonNegative(fn, 'the dial half division', input.dialHalfDivision);
  assertFinite(fn, 'the dial slope', input.dialSlopeHzPerDiv);
  assertNonNegative(fn, 'the drift', input.driftHz);
  assertNonNegative(fn, "the standard's calibration U", input.standardCalUHz);
  assertPositive(fn, "the standard's coverage factor", input.standardCalK);

  const rectangular = DISTRIBUTION_DIVISORS.rectangular;
  const components: UncertaintyComponent[] = [
    {
      name: 'Reference standard time-base accuracy',
      kind: 'B',
      distribution: 'rectangular',
      value: input.standardAccuracyPpm * 1e-6 * input.nominalHz,
      divisor: rectangular,
      sensitivity: 1,
      dof: null,
    },
    {
      name: 'Counter resolution (±1 count)',
      kind: 'B',
      distribution: 'rectangular',
      value: input.counterResolutionHz,
      divisor: rectangular,
      sensitivity: 1,
      dof: null,
    },
  ];
  const notes: string[] = [];
  if (input.measuredSamples.length >= 2) {
    const sample = summariseSample(input.measuredSamples);
    components.push({
      name: 'Repeatability (s/√n)',
      kind: 'A',
      distribution: 'normal',
      value: sample.sd / Math.sqrt(sample.n),
      divisor: 1,
      sensitivity: 1,
      dof: sample.n - 1,
    });
  } else {
    assertFinite(fn, 'the reading', input.measuredSamples[0]!);
    notes.push('Repeatability not evaluated: one reading at this point');
  }
  components.push(
    {
      name: 'Dial reading resolution (half a division)',
      kind: 'B',
      distribution: 'rectangular',
      value: input.dialHalfDivision,
      divisor: rectangular,
      sensitivity: input.dialSlopeHzPerDiv,
      dof: null,
    },
    { name: 'Drift during the measurement', kind: 'B', distribution: 'rectangular', value: input.driftHz, divisor: rectangular, sensitivity: 1, dof: null },
    {
      name: 'Reference standard calibration (U/k)',
      kind: 'B',
      distribution: 'normal',
      value: input.standardCalUHz,
      divisor: input.standardCalK,
      sensitivity: 1,
      dof: null,
    },
  );
  return { components, notes };
}
