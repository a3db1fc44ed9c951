// Kilocycle's metrology core: pure functions, no I/O, no clock.
export { MetrologyError, type MetrologyErrorCode } from './metrology-error.js';
export type { FrequencyUnit } from '../units/frequency-unit.js';

// Calibration error per range (§5.1)
export { fitLine, type LineFit } from './fit-line.js';
export { lineAtMidSpan } from './line-at-mid-span.js';
export { dialToNominal, TABLE_EXTRAPOLATION_FRACTION, type DialLaw } from './dial-law.js';
export { toleranceHz, type Tolerance } from './tolerance.js';
export {
  analyseCalibration,
  OUTLIER_STUDENTISED_LIMIT,
  type CalibrationAnalysis,
  type CalibrationFit,
  type CalibrationPoint,
  type CalibrationReading,
  type TrackingSummary,
} from './analyse-calibration.js';
export { dialForFrequency, dialForFrequencyEstimate, type DialEstimate } from './dial-for-frequency.js';
export { dialSlope } from './dial-slope.js';
export { ppmToHz } from './ppm-to-hz.js';
export { hzToPpm } from './hz-to-ppm.js';
export { sampleMean } from './sample-mean.js';
export { meanEstimate } from './mean-estimate.js';

// Alignment and padding (§5.2)
export { alignLC, frequencyWithPadder, paddingForShift, type AlignLCInput, type AlignLCResult } from './align-lc.js';

// Warm-up drift (§5.3)
export { evaluateWarmup, fitWarmup, WARMUP_MAX_FIT_POINTS, type WarmupFit } from './fit-warmup.js';
export { driftRateWindows, type DriftWindow } from './drift-rate-windows.js';
export { settlingTime, type SettlingCriterion } from './settling-time.js';
export { counterSettled, type CounterSettle } from './counter-settled.js';
export { warmupSummary, type WarmupSummary } from './warmup-summary.js';
export { warmupSettling, type WarmupSettling } from './warmup-settling.js';

// Stability (§5.4)
export { fractionalFrequency } from './fractional-frequency.js';
export { octaves, overlappingAdev, phaseFromFrequency, type StabilityOptions, type StabilityPoint } from './overlapping-adev.js';
export { modifiedAdev } from './modified-adev.js';
export { adevEdf, chiSquaredInterval, type NoiseType } from './stability-confidence.js';
export { detectGaps, type GapReport } from './detect-gaps.js';
export { decades } from './decades.js';
export type { DeviationOptions, DeviationPoint } from './deviation-input.js';
export { hadamardDev, type HadamardOptions } from './hadamard-dev.js';
export { timeDev } from './time-dev.js';
export { totalDev } from './total-dev.js';
export { greenhallEdf, NOISE_ALPHA, type EdfEstimator } from './greenhall-edf.js';
export { totalDevEdf, TOTAL_DEV_EDF_COEFFICIENTS } from './total-dev-edf.js';
export { phaseFromFractionalFrequency } from './phase-from-fractional-frequency.js';
export { frequencyFromPhase } from './frequency-from-phase.js';
export { linearFrequencyDrift, type DriftEstimate } from './linear-frequency-drift.js';
export { threePointDrift } from './three-point-drift.js';
export { bisectionDrift } from './bisection-drift.js';
export { identifyNoise, B1_MIN_POINTS, LAG1_MIN_POINTS, type NoiseIdentification } from './identify-noise.js';
export { longestContinuousSegment, type ContinuousSegment } from './longest-continuous-segment.js';
export { fillPhaseGaps, type FilledPhase } from './fill-phase-gaps.js';
export { madOutliers, MAD_TO_SIGMA, type MadScreen } from './mad-outliers.js';
export { removeLinearFrequencyDrift, type DriftRemoved } from './remove-linear-frequency-drift.js';
export {
  stabilityFactorLimit,
  stabilityTable,
  TABLE_DEVIATIONS,
  type DeviationValue,
  type NoiseAtFactor,
  type StabilityTableOptions,
  type StabilityTableRow,
  type TableDeviation,
} from './stability-table.js';

// Comparison (§5.5)
export { summariseSample, welchDifference, welchFromSamples, type SampleSummary, type WelchDifference } from './welch-difference.js';
export { describeDifference } from './describe-difference.js';
export { supplySensitivity } from './supply-sensitivity.js';
export { keyingShift, type KeyingShift } from './keying-shift.js';
export { welchFromEstimates, type Estimate } from './welch-from-estimates.js';
export { adevEstimate } from './adev-estimate.js';
export { overlappingAdevAt } from './overlapping-adev-at.js';
export { warmupCovariance, type WarmupCovariance } from './warmup-covariance.js';
export { settlingTimeUncertainty } from './settling-time-uncertainty.js';

// Uncertainty and decision (§5.6)
export { COVERAGE_95_45, coverageFactor } from './coverage-factor.js';
export { combineUncertainty, DISTRIBUTION_DIVISORS, welchSatterthwaite, type CombinedUncertainty, type UncertaintyComponent } from './combine-uncertainty.js';
export { roundResultToUncertainty, roundUncertainty } from './round-uncertainty.js';
export { frequencyBudget, type FrequencyBudgetInput } from './frequency-budget.js';
export { decide, TUR_FLAG_BELOW, type Decision, type DecisionResult, type DecisionRule } from './decide.js';
export { jobOutcomes, withOutcomes } from './job-outcomes.js';

// Band planner (§5.7)
export {
  AMATEUR_BANDS_BY_REGION,
  AMATEUR_BANDS_SOURCE,
  bandsForRegion,
  ITU_REGION_NAMES,
  ITU_REGIONS_WITH_BANDS,
  NATIONAL_RULES_NOTE,
  US_60M_CHANNELS_HZ,
  type AmateurBand,
  type AmateurBandStatus,
  type ItuRegion,
} from './amateur-bands.js';
export { dialForOutput, planBands, type BandPlanRow } from './plan-bands.js';

// Charts
export { downsampleLttb } from './downsample-lttb.js';
