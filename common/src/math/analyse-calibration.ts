import { dialToNominal, type DialLaw } from './dial-law.js';
import { fitLine } from './fit-line.js';
import { hzToPpm } from './hz-to-ppm.js';
import { assertFinite } from './guards.js';
import { MetrologyError } from './metrology-error.js';
import { toleranceHz, type Tolerance } from './tolerance.js';

/** One reading as captured: dial setting and counter frequency (Hz). */
export type CalibrationReading = { dial: number; frequency: number; excluded?: boolean };

/** One dial setting after averaging its readings. */
export type CalibrationPoint = {
  dial: number;
  /** Nominal frequency from the dial law, Hz. */
  nominal: number;
  /** Mean of the included readings at this setting, Hz. */
  measured: number;
  n: number;
  /** Sample standard deviation of the readings (Hz), null for a single reading. */
  sd: number | null;
  /** measured − nominal, Hz. */
  errorHz: number;
  errorPpm: number;
  errorPercent: number;
  /** Tolerance half-width at this nominal (Hz), null when no tolerance is given. */
  toleranceHz: number | null;
  /** Error left after the best-fit line (tracking error against the best fit), Hz. */
  residualBestFit: number;
  /** Error left after the end-point line (tracking error after a two-end alignment), Hz. */
  residualEndPoint: number;
  /** Externally studentised residual of the best fit, null when it cannot be formed (under 4 settings). */
  studentised: number | null;
  /** |studentised| > 3: flagged for a look, never removed. */
  outlier: boolean;
};

/** Least-squares line of error against nominal: errorHz ≈ offsetHz + slope × nominal. */
export type CalibrationFit = {
  offsetHz: number;
  /** Scale error, dimensionless (Hz of error per Hz of nominal). */
  slope: number;
  seOffset: number;
  seSlope: number;
  residualSd: number;
  r2: number;
  n: number;
};

export type TrackingSummary = { maxAbsHz: number; rmsHz: number };

export type CalibrationAnalysis = {
  points: CalibrationPoint[];
  fit: CalibrationFit | null;
  tracking: { bestFit: TrackingSummary; endPoint: TrackingSummary } | null;
  /** Correction table: add correctionHz (= measured − nominal) to a dial's nominal to get the frequency it really gives. */
  corrections: Array<{ dial: number; nominal: number; measured: number; correctionHz: number }>;
};

/** Studentised residuals above this magnitude are flagged as outliers. */
export const OUTLIER_STUDENTISED_LIMIT = 3;

/**
 * Calibration error of one range (PRODUCT §5.1).
 *
 * 1. Excluded readings are dropped; readings at the same dial value are averaged
 *    (mean, sample SD, n). Nominal frequency comes from the dial law.
 * 2. error = measured − nominal, in Hz, ppm and %.
 * 3. With 3 or more distinct settings, a least-squares line of error against nominal
 *    ({@link fitLine}): offset, scale error (slope), standard errors, residual SD, R².
 * 4. Tracking error: residuals from the best-fit line, and from the end-point line
 *    through the lowest and highest settings (what is left after a two-end alignment);
 *    each summarised as max |·| and RMS.
 * 5. Outliers: externally studentised residuals t_i = e_i / (s_(i)·√(1 − h_ii)), with
 *    s_(i) the residual SD without point i and h_ii = 1/n + (x_i − x̄)²/Sxx
 *    (Belsley, Kuh & Welsch 1980; R's `rstudent`); |t_i| > 3 is flagged. The deleted
 *    form is used because an internally studentised residual can never exceed
 *    √(n − 2) and so could not flag anything in a ten-point run. When the other
 *    points lie exactly on a line, t_i is ±Infinity for a point off it.
 *
 * With fewer than 3 settings `fit`, `tracking` and `studentised` are null and both
 * residuals are 0 (two points define both lines exactly).
 *
 * @param input dial law, optional tolerance, readings (frequency in Hz)
 * @returns per-point table (sorted by dial), fit, tracking summary, correction table
 * @throws {MetrologyError} 'too_few_points' (no included readings), 'not_finite', and
 *   whatever {@link dialToNominal} or {@link toleranceHz} throw for the law or tolerance
 * @example
 * analyseCalibration({ law: { kind: 'direct', unit: 'kHz' }, readings: [{ dial: 1750, frequency: 1_735_000 }] })
 *   .points[0].errorPercent; // => -0.857…
 */
export function analyseCalibration(input: { law: DialLaw; tolerance?: Tolerance; readings: ReadonlyArray<CalibrationReading> }): CalibrationAnalysis {
  const fn = 'analyseCalibration';
  const groups = new Map<number, number[]>();
  for (const reading of input.readings) {
    if (reading.excluded === true) continue;
    assertFinite(fn, 'dial values', reading.dial);
    assertFinite(fn, 'frequencies', reading.frequency);
    const key = reading.dial === 0 ? 0 : reading.dial; // fold −0 into 0
    const list = groups.get(key);
    if (list === undefined) groups.set(key, [reading.frequency]);
    else list.push(reading.frequency);
  }
  if (groups.size === 0) {
    throw new MetrologyError('too_few_points', `${fn} requires at least 1 data point (all readings are excluded or none were given)`);
  }

  const partial = [...groups.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([dial, frequencies]) => {
      const nominal = dialToNominal(input.law, dial);
      const n = frequencies.length;
      const measured = meanOf(frequencies);
      const sd = n >= 2 ? sampleSd(frequencies, measured) : null;
      const errorHz = measured - nominal;
      return {
        dial,
        nominal,
        measured,
        n,
        sd,
        errorHz,
        errorPpm: hzToPpm(errorHz, nominal),
        errorPercent: (errorHz / nominal) * 100,
        toleranceHz: input.tolerance === undefined ? null : toleranceHz(input.tolerance, nominal),
      };
    });

  const nominals = partial.map((p) => p.nominal);
  const errors = partial.map((p) => p.errorHz);
  const count = partial.length;

  // End-point line through the lowest and highest settings.
  const first = partial[0]!;
  const last = partial[count - 1]!;
  const endPointResidual = (nominal: number, error: number): number =>
    count < 2 || last.nominal === first.nominal
      ? error - first.errorHz
      : error - (first.errorHz + ((last.errorHz - first.errorHz) * (nominal - first.nominal)) / (last.nominal - first.nominal));

  let fit: CalibrationFit | null = null;
  let residualsBest: number[] = partial.map(() => 0);
  let studentised: Array<number | null> = partial.map(() => null);
  if (count >= 3) {
    const line = fitLine(nominals, errors);
    fit = {
      offsetHz: line.intercept,
      slope: line.slope,
      seOffset: line.seIntercept,
      seSlope: line.seSlope,
      residualSd: line.residualSd,
      r2: line.r2,
      n: line.n,
    };
    residualsBest = partial.map((p) => p.errorHz - (line.intercept + line.slope * p.nominal));
    if (count >= 4) {
      studentised = residualsBest.map((residual, i) => {
        const dx = nominals[i]! - line.meanX;
        const leverage = 1 / count + (dx * dx) / line.sxx;
        const oneMinusH = 1 - leverage;
        const deletedSsr = line.ssr - (residual * residual) / oneMinusH;
        const deletedVariance = Math.max(deletedSsr, 0) / (count - 3);
        if (residual === 0 || oneMinusH <= 0) return 0;
        if (deletedVariance === 0) return residual > 0 ? Number.POSITIVE_INFINITY : Number.NEGATIVE_INFINITY;
        return residual / Math.sqrt(deletedVariance * oneMinusH);
      });
    }
  }
  const residualsEnd = partial.map((p) => (count < 3 ? 0 : endPointResidual(p.nominal, p.errorHz)));

  const points: CalibrationPoint[] = partial.map((p, i) => {
    const t = studentised[i] ?? null;
    return {
      ...p,
      residualBestFit: residualsBest[i]!,
      residualEndPoint: residualsEnd[i]!,
      studentised: t,
      outlier: t !== null && Math.abs(t) > OUTLIER_STUDENTISED_LIMIT,
    };
  });

  return {
    points,
    fit,
    tracking: fit === null ? null : { bestFit: summarise(residualsBest), endPoint: summarise(residualsEnd) },
    corrections: points.map((p) => ({ dial: p.dial, nominal: p.nominal, measured: p.measured, correctionHz: p.measured - p.nominal })),
  };
}

function meanOf(values: readonly number[]): number {
  let sum = 0;
  for (const value of values) sum += value;
  const first = sum / values.length;
  let correction = 0;
  for (const value of values) correction += value - first;
  return first + correction / values.length;
}

function sampleSd(values: readonly number[], mean: number): number {
  let sum = 0;
  for (const value of values) sum += (value - mean) ** 2;
  return Math.sqrt(sum / (values.length - 1));
}

function summarise(residuals: readonly number[]): TrackingSummary {
  let maxAbs = 0;
  let sumSquares = 0;
  for (const residual of residuals) {
    maxAbs = Math.max(maxAbs, Math.abs(residual));
    sumSquares += residual * residual;
  }
  return { maxAbsHz: maxAbs, rmsHz: Math.sqrt(sumSquares / residuals.length) };
}
