import { BadRequestException, Injectable, NotFoundException } from '@nestjs/common';
import {
  adevEstimate,
  coverageFactor,
  describeDifference,
  detectGaps,
  downsampleLttb,
  driftRateWindows,
  evaluateWarmup,
  fitWarmup,
  fractionalFrequency,
  keyingShift,
  linearFrequencyDrift,
  longestContinuousSegment,
  meanEstimate,
  MetrologyError,
  overlappingAdev,
  overlappingAdevAt,
  sampleMean,
  settlingTime,
  settlingTimeUncertainty,
  supplySensitivity,
  warmupCovariance,
  welchFromEstimates,
  type DriftWindow,
  type Estimate,
  type WarmupFit,
} from '@kilocycle/common/math';
import {
  COMPARABLE_RUN_KINDS,
  COMPARISON_ADEV_TAUS,
  COMPARISON_CONFIDENCE,
  DEFAULT_COMPARISON_WINDOW_SECONDS,
  DEFAULT_COMPARISON_WITHIN_HZ,
  MAX_COMPARED_RUNS,
  MAX_SERIES_POINTS,
  MIN_COMPARED_RUNS,
  type ComparableRunKind,
  type ComparedRun,
  type ComparisonCurve,
  type ComparisonDifference,
  type ComparisonEstimate,
  type ComparisonOptions,
  type ComparisonQuantity,
  type ComparisonResult,
  type ComparisonRow,
  type InstrumentSensitivity,
  type KeyingEntry,
  type RunDataKind,
  type RunKind,
  type SupplySensitivityEntry,
} from '@kilocycle/common/types';
import { AnalysisService, keyingSides, supplyPairs } from '../analysis/analysis.service.js';
import { InstrumentComparisonReader } from '../instruments/instrument-comparison.reader.js';
import { JobComparisonReader } from '../jobs/job-comparison.reader.js';
import { RunComparisonReader, type ComparedRunRow } from '../runs/run-comparison.reader.js';
import { ADEV_QUANTITY_TAU, COMPARISON_ROWS, engineeringExponent, powerOfTenText } from './comparison-rows.js';

/** Points of the fitted curve drawn from power-on to the last reading. */
const FITTED_POINTS = 200;
/** Newest runs of each kind shown in the sensitivity block. */
const SENSITIVITY_RUNS = 10;
/** The settled part must hold this many windows of the default length, else the window is shortened to a third of the shortest settled part. */
const WINDOWS_WANTED = 3;

type RunMeta = {
  id: number;
  kind: RunKind;
  dataKind: RunDataKind;
  jobId: number;
  jobNumber: string;
  instrumentId: number;
  instrumentLabel: string;
  rangeId: number;
  rangeLabel: string;
  startedAt: Date;
  endedAt: Date | null;
  configuration: string | null;
  notes: string | null;
  supplyVoltage: number | null;
};

/** One run with its included readings in time order and what the first stage worked out. */
type Prepared = {
  meta: RunMeta;
  label: string;
  /** The settling band, Hz. */
  withinHz: number;
  readingCount: number;
  t: Float64Array;
  f: Float64Array;
  fit: WarmupFit | null;
  fitProblem: string | null;
  /** Index of the first settled reading, or null when the run never settles within its record. */
  settledIndex: number | null;
  settledFrom: number | null;
};

type RunOutcome = {
  run: ComparedRun;
  estimates: Partial<Record<ComparisonQuantity, ComparisonEstimate>>;
  problems: Partial<Record<ComparisonQuantity, string>>;
};

function problemText(error: unknown): string {
  if (error instanceof MetrologyError) return error.message;
  throw error;
}

/** Two-sided Student-t interval of an estimate (t from common's coverageFactor). */
function interval(estimate: Estimate, confidence = COMPARISON_CONFIDENCE): ComparisonEstimate {
  const t = coverageFactor(estimate.df, confidence);
  return { ...estimate, low: estimate.value - t * estimate.se, high: estimate.value + t * estimate.se };
}

/**
 * The comparison of two to six warm-up or stability runs of one instrument (PRODUCT §5.5).
 *
 * Every quantity of every run is an estimate with a standard error and degrees of freedom, and the
 * difference of each run to the first is Welch's interval of two such estimates (common's
 * welchFromEstimates: se = √(se₁² + se₂²), Welch–Satterthwaite ν, Student t at 95 %):
 * - τ, A, f∞: the warm-up fit's standard errors, ν = n − 3. These rest on independent residuals;
 *   with strongly correlated counter noise they are optimistic, which the method column says.
 * - settling time (within N Hz): τ·ln(|A|/N), standard error by the delta method with the fit's full
 *   covariance (τ and A are strongly correlated), ν = n − 3.
 * - settled drift rate: the mean of the per-window least-squares rates over back-to-back windows after
 *   settling, se = s/√k, ν = k − 1 — the spread between windows carries any slow wander the counter
 *   noise does not, so this one does not lean on independent readings.
 * - Allan deviation at 1, 10 and 100 s over the settled part: se = σ/√(2·edf), ν = edf (χ² variance).
 */
@Injectable()
export class ComparisonEngine {
  constructor(
    private readonly analysis: AnalysisService,
    private readonly runs: RunComparisonReader,
    private readonly jobs: JobComparisonReader,
    private readonly instruments: InstrumentComparisonReader,
  ) {}

  /** Checks that the runs can be compared: 2–6 distinct, all found, one instrument, all warm-up or all stability. */
  async validateRuns(
    runIds: readonly number[],
    labels?: readonly string[],
  ): Promise<{ metas: RunMeta[]; kind: ComparableRunKind; instrumentId: number; instrumentLabel: string; labels: string[] }> {
    if (runIds.length < MIN_COMPARED_RUNS || runIds.length > MAX_COMPARED_RUNS) {
      throw new BadRequestException(`runIds: a comparison takes ${MIN_COMPARED_RUNS} to ${MAX_COMPARED_RUNS} runs (got ${runIds.length})`);
    }
    if (new Set(runIds).size !== runIds.length) throw new BadRequestException('runIds: each run may appear only once');
    if (labels !== undefined && labels.length !== runIds.length) {
      throw new BadRequestException(`labels: give one label per run (${runIds.length}), or none`);
    }
    const metas = await this.metas(runIds);
    const byId = new Map(metas.map((m) => [m.id, m]));
    const ordered = runIds.map((id) => {
      const meta = byId.get(id);
      if (!meta) throw new NotFoundException(`Run ${id} not found`);
      return meta;
    });
    const first = ordered[0]!;
    for (const meta of ordered) {
      if (!(COMPARABLE_RUN_KINDS as readonly RunKind[]).includes(meta.kind)) {
        throw new BadRequestException(`run ${meta.id} is a ${meta.kind} run; only warmup and stability runs can be compared`);
      }
      // A comparison works on frequency: a phase run is studied on its own page (its deviations are converted there).
      if (meta.dataKind !== 'frequency') {
        throw new BadRequestException(`run ${meta.id} holds phase readings (time interval, s); a comparison takes runs of frequency readings`);
      }
      if (meta.kind !== first.kind)
        throw new BadRequestException(
          `a comparison takes warm-up runs or stability runs, not both (run ${first.id} is ${first.kind}, run ${meta.id} is ${meta.kind})`,
        );
      if (meta.instrumentId !== first.instrumentId) {
        throw new BadRequestException(
          `the runs must be of one instrument (run ${first.id} is of ${first.instrumentLabel}, run ${meta.id} of ${meta.instrumentLabel})`,
        );
      }
    }
    const resolvedLabels = ordered.map((meta, i) => labels?.[i]?.trim() || `run ${meta.id}`);
    return {
      metas: ordered,
      kind: first.kind as ComparableRunKind,
      instrumentId: first.instrumentId,
      instrumentLabel: first.instrumentLabel,
      labels: resolvedLabels,
    };
  }

  async compute(request: ComparisonOptions & { runIds: readonly number[]; labels?: readonly string[] }): Promise<ComparisonResult> {
    const { metas, kind, instrumentId, instrumentLabel: label, labels } = await this.validateRuns(request.runIds, request.labels);
    const withinHz = request.withinHz ?? DEFAULT_COMPARISON_WITHIN_HZ;
    const prepared: Prepared[] = [];
    // One run at a time: only the included times and frequencies are kept, not the whole series.
    for (const [i, meta] of metas.entries()) prepared.push(await this.prepare(meta, labels[i]!, kind, withinHz));
    const windowSeconds = request.windowSeconds ?? this.defaultWindow(prepared);
    const outcomes = prepared.map((p) => this.study(p, kind, windowSeconds));
    return {
      instrumentId,
      instrumentLabel: label,
      kind,
      options: { withinHz, windowSeconds },
      confidence: COMPARISON_CONFIDENCE,
      runs: outcomes.map((o) => o.run),
      rows: this.rows(kind, outcomes, withinHz, windowSeconds),
      sensitivity: await this.sensitivity(instrumentId, label),
    };
  }

  /** Supply sensitivity and keying shift from the instrument's newest runs of those kinds. */
  async sensitivity(instrumentId: number, label?: string): Promise<InstrumentSensitivity> {
    let instrumentName = label;
    if (instrumentName === undefined) {
      instrumentName = (await this.instruments.labels([instrumentId])).get(instrumentId);
      if (instrumentName === undefined) throw new NotFoundException(`Instrument ${instrumentId} not found`);
    }
    const jobs = await this.jobs.ofInstrument(instrumentId);
    const runs = await this.runs.ofJobs([...jobs.keys()], ['supply_sensitivity', 'keying']);
    const rangeLabels = await this.instruments.rangeLabels(runs.map((r) => r.rangeId));
    const supply: SupplySensitivityEntry[] = [];
    const keying: KeyingEntry[] = [];
    for (const run of runs) {
      const isSupply = run.kind === 'supply_sensitivity';
      if ((isSupply ? supply.length : keying.length) >= SENSITIVITY_RUNS) continue;
      const base = {
        runId: run.id,
        jobNumber: jobs.get(run.jobId)!.number,
        rangeLabel: rangeLabels.get(run.rangeId) ?? '',
        startedAt: run.startedAt.toISOString(),
        configuration: run.configuration,
      };
      const { frequency, aux } = await this.analysis.includedSeries(run.id, run.kind);
      if (isSupply) supply.push(supplyEntry(base, frequency, aux));
      else keying.push(keyingEntry(base, frequency, aux));
    }
    return { instrumentId, instrumentLabel: instrumentName, supplySensitivity: supply, keying };
  }

  /** The runs with their job, range and instrument, read from their owners (ids not found are absent). */
  private async metas(runIds: readonly number[]): Promise<RunMeta[]> {
    const runs = await this.runs.runs(runIds);
    const jobs = await this.jobs.jobs(runs.map((r) => r.jobId));
    const rangeLabels = await this.instruments.rangeLabels(runs.map((r) => r.rangeId));
    const instrumentLabels = await this.instruments.labels([...jobs.values()].map((j) => j.instrumentId));
    return runs.map((run: ComparedRunRow) => {
      const job = jobs.get(run.jobId)!;
      return {
        ...run,
        jobNumber: job.number,
        instrumentId: job.instrumentId,
        instrumentLabel: instrumentLabels.get(job.instrumentId) ?? '',
        rangeLabel: rangeLabels.get(run.rangeId) ?? '',
      };
    });
  }

  private async prepare(meta: RunMeta, label: string, kind: ComparableRunKind, withinHz: number): Promise<Prepared> {
    const { readingCount, t, frequency } = await this.analysis.includedSeries(meta.id, meta.kind);
    let fit: WarmupFit | null = null;
    let fitProblem: string | null = null;
    if (kind === 'warmup') {
      try {
        fit = fitWarmup(t, frequency);
      } catch (error) {
        fitProblem = problemText(error);
      }
    } else {
      fitProblem = 'a stability run is not fitted with a warm-up curve';
    }
    let settledFrom: number | null = t.length > 0 ? t[0]! : null;
    if (fit) {
      const settling = settlingTime(fit, { kind: 'within_hz', hz: withinHz })!;
      settledFrom = t.length > 0 && settling <= t[t.length - 1]! ? settling : null;
    }
    let settledIndex: number | null = null;
    if (settledFrom !== null) {
      settledIndex = 0;
      while (settledIndex < t.length && t[settledIndex]! < settledFrom) settledIndex++;
    }
    return { meta, label, withinHz, readingCount, t, f: frequency, fit, fitProblem, settledIndex, settledFrom };
  }

  /** The default window: 600 s, or a third of the shortest settled part when that is under 30 min (whole seconds). */
  private defaultWindow(prepared: readonly Prepared[]): number {
    let shortest = Number.POSITIVE_INFINITY;
    for (const p of prepared) {
      if (p.settledIndex === null || p.settledIndex >= p.t.length) continue;
      shortest = Math.min(shortest, p.t[p.t.length - 1]! - p.t[p.settledIndex]!);
    }
    if (!Number.isFinite(shortest) || shortest >= WINDOWS_WANTED * DEFAULT_COMPARISON_WINDOW_SECONDS) return DEFAULT_COMPARISON_WINDOW_SECONDS;
    return Math.max(1, Math.floor(shortest / WINDOWS_WANTED));
  }

  /** One run's estimates and curves: the warm-up fit's quantities, then the settled part's drift rate and Allan deviations. */
  private study(p: Prepared, kind: ComparableRunKind, windowSeconds: number): RunOutcome {
    const estimates: RunOutcome['estimates'] = {};
    const problems: RunOutcome['problems'] = {};
    fitEstimates(p, estimates, problems);
    const settled = settledEstimates(p, kind, windowSeconds, estimates, problems);
    const { reference, points, fitted } = runCurves(p);
    const meta = p.meta;
    return {
      estimates,
      problems,
      run: {
        runId: meta.id,
        label: p.label,
        kind,
        jobId: meta.jobId,
        jobNumber: meta.jobNumber,
        rangeId: meta.rangeId,
        rangeLabel: meta.rangeLabel,
        startedAt: meta.startedAt.toISOString(),
        endedAt: meta.endedAt ? meta.endedAt.toISOString() : null,
        configuration: meta.configuration,
        notes: meta.notes,
        supplyVoltage: meta.supplyVoltage,
        readingCount: p.readingCount,
        usedCount: p.t.length,
        fit: p.fit,
        fitProblem: p.fitProblem,
        reference,
        points,
        fitted,
        settledFromSeconds: p.settledFrom,
        ...settled,
      },
    };
  }

  private rows(kind: ComparableRunKind, outcomes: readonly RunOutcome[], withinHz: number, windowSeconds: number): ComparisonRow[] {
    return COMPARISON_ROWS.filter((row) => row.kinds.includes(kind)).map((definition) => {
      const name = kind === 'stability' && definition.quantity === 'settledDriftRate' ? 'drift rate' : definition.name(withinHz);
      const values = outcomes.map((o) => o.estimates[definition.quantity] ?? null);
      const problems: Array<string | null> = outcomes.map((o) => o.problems[definition.quantity] ?? null);
      const isAdev = definition.quantity in ADEV_QUANTITY_TAU;
      const exponent = isAdev ? engineeringExponent(values.find((v) => v !== null)?.value ?? 0) : 0;
      const scale = 10 ** -exponent;
      const unitWords = isAdev ? powerOfTenText(exponent) : definition.unit;
      const first = values[0];
      const differences = values.map((value, i): ComparisonDifference | null => {
        if (i === 0 || value === null || !first) return null;
        try {
          const diff = welchFromEstimates(first, value, COMPARISON_CONFIDENCE);
          const shown = isAdev ? { difference: diff.difference * scale, low: diff.low * scale, high: diff.high * scale, confidence: diff.confidence } : diff;
          return { ...diff, sentence: describeDifference(outcomes[i]!.run.label, name, unitWords, shown) };
        } catch (error) {
          problems[i] ??= problemText(error);
          return null;
        }
      });
      if (!first) for (let i = 1; i < values.length; i++) if (values[i] !== null) problems[i] ??= `no difference: ${outcomes[0]!.run.label} has no ${name}`;
      return { quantity: definition.quantity, name, unit: definition.unit, method: definition.method(windowSeconds, kind), values, differences, problems };
    });
  }
}

type Estimates = RunOutcome['estimates'];
type Problems = RunOutcome['problems'];
const ADEV_QUANTITIES = ['adev1s', 'adev10s', 'adev100s'] as const;

/** τ, A, f∞ with the fit's standard errors (ν = n − 3), and the settling time by the delta method. */
function fitEstimates(p: Prepared, estimates: Estimates, problems: Problems): void {
  const { fit } = p;
  if (!fit) {
    if (p.fitProblem) for (const q of ['tau', 'amplitude', 'fInf', 'settlingTime'] as const) problems[q] = p.fitProblem;
    return;
  }
  const df = fit.n - 3;
  estimates.tau = interval({ value: fit.tau, se: fit.seTau, df });
  estimates.amplitude = interval({ value: fit.amplitude, se: fit.seAmplitude, df });
  estimates.fInf = interval({ value: fit.fInf, se: fit.seFInf, df });
  try {
    const settling = settlingTimeUncertainty(fit, warmupCovariance(p.t, fit), p.withinHz);
    estimates.settlingTime = interval({ value: settling.seconds, se: settling.se, df: settling.df });
  } catch (error) {
    problems.settlingTime = problemText(error);
  }
}

/** The settled part's drift windows and rate, and its Allan deviation; a run that does not settle has neither. */
function settledEstimates(
  p: Prepared,
  kind: ComparableRunKind,
  windowSeconds: number,
  estimates: Estimates,
  problems: Problems,
): Pick<ComparedRun, 'driftWindows' | 'stability' | 'stabilityProblem'> {
  const n = p.t.length;
  if (p.settledIndex === null || n - p.settledIndex < 3) {
    const reason = p.settledIndex === null ? `the run does not settle within ${p.withinHz} Hz before its last reading` : 'fewer than 3 readings after settling';
    problems.settledDriftRate = reason;
    for (const q of ADEV_QUANTITIES) problems[q] = reason;
    return { driftWindows: [], stability: null, stabilityProblem: reason };
  }
  const ts = p.t.subarray(p.settledIndex);
  const fs = p.f.subarray(p.settledIndex);
  const driftWindows = driftEstimate(ts, fs, windowSeconds, estimates, problems);
  // A stability run's drift rate, value and interval alike, is the least-squares line on frequency (as its analysis gives it).
  if (kind === 'stability') stabilityDriftEstimate(ts, fs, estimates, problems);
  try {
    return { driftWindows, stability: adevEstimates(ts, fs, estimates, problems), stabilityProblem: null };
  } catch (error) {
    const stabilityProblem = problemText(error);
    for (const q of ADEV_QUANTITIES) problems[q] = stabilityProblem;
    return { driftWindows, stability: null, stabilityProblem };
  }
}

/** The mean of the per-window rates over back-to-back windows, se = s/√k, ν = k − 1 (common's meanEstimate). */
function driftEstimate(ts: Float64Array, fs: Float64Array, windowSeconds: number, estimates: Estimates, problems: Problems): DriftWindow[] {
  try {
    const windows = driftRateWindows(ts, fs, windowSeconds);
    if (windows.length < 2) {
      problems.settledDriftRate = `the settled part holds ${windows.length} window of ${windowSeconds} s; a standard error needs two or more`;
    } else {
      estimates.settledDriftRate = interval(meanEstimate(windows.map((w) => w.rateHzPerMin)));
    }
    return windows;
  } catch (error) {
    problems.settledDriftRate = problemText(error);
    return [];
  }
}

/**
 * A stability run's drift rate: common's linearFrequencyDrift over the longest continuous segment (the segment its
 * analysis studies by default), in Hz/min; se from the line's residual scatter, ν = n − 2. Replaces the windows' mean.
 */
function stabilityDriftEstimate(ts: Float64Array, fs: Float64Array, estimates: Estimates, problems: Problems): void {
  delete estimates.settledDriftRate;
  delete problems.settledDriftRate;
  try {
    const tau0 = detectGaps(ts, 1).medianInterval;
    if (!(tau0 > 0)) throw new MetrologyError('not_sorted', 'the readings share one time stamp, so they have no interval');
    const gaps = detectGaps(ts, tau0).gaps;
    const segment = gaps.length > 0 ? longestContinuousSegment(fs, gaps).values : fs;
    const drift = linearFrequencyDrift(segment, tau0);
    if (drift.standardError === null || !(drift.standardError > 0)) {
      problems.settledDriftRate = 'the readings lie on a straight line: the drift rate has no standard error';
      return;
    }
    estimates.settledDriftRate = interval({ value: drift.drift * 60, se: drift.standardError * 60, df: segment.length - 2 });
  } catch (error) {
    problems.settledDriftRate = problemText(error);
  }
}

/**
 * Allan deviation over the settled part at its octaves and at 1, 10 and 100 s (throws a MetrologyError when it has no
 * interval), over the longest continuous segment when the settled part has gaps: an Allan deviation across a gap
 * would difference readings either side of it as if they were neighbours (NIST SP 1065 on gaps).
 */
function adevEstimates(ts: Float64Array, fs: Float64Array, estimates: Estimates, problems: Problems): NonNullable<ComparedRun['stability']> {
  const tau0 = detectGaps(ts, 1).medianInterval;
  if (!(tau0 > 0)) throw new MetrologyError('not_sorted', 'the settled readings share one time stamp, so they have no interval');
  const gaps = detectGaps(ts, tau0);
  const { start, end, leftOut } = gaps.gaps.length > 0 ? longestContinuousSegment(fs, gaps.gaps) : { start: 0, end: fs.length, leftOut: 0 };
  const used = fs.subarray(start, end);
  const referenceHz = sampleMean(used);
  const y = fractionalFrequency(used, referenceHz);
  const options = { confidence: COMPARISON_CONFIDENCE };
  const stability = {
    tau0,
    fromSeconds: ts[start]!,
    toSeconds: ts[end - 1]!,
    count: end - start,
    leftOut,
    referenceHz,
    gapCount: gaps.gaps.length,
    irregular: gaps.irregular,
    adev: overlappingAdev(y, tau0, options),
  };
  const at = overlappingAdevAt(y, tau0, COMPARISON_ADEV_TAUS, options);
  for (const quantity of ADEV_QUANTITIES) {
    const tau = ADEV_QUANTITY_TAU[quantity]!;
    const point = at[COMPARISON_ADEV_TAUS.indexOf(tau as (typeof COMPARISON_ADEV_TAUS)[number])];
    if (!point) {
      problems[quantity] =
        `the readings (every ${round(tau0)} s, ${round(ts[end - 1]! - ts[start]!)} s ${leftOut > 0 ? 'without a gap' : 'settled'}) do not give τ = ${tau} s`;
      continue;
    }
    estimates[quantity] = { ...adevEstimate(point), low: point.ciLow, high: point.ciHigh };
  }
  return stability;
}

/** The run's readings (downsampled) and fitted curve as frequency and deviation from its reference (f∞, else the mean). */
function runCurves(p: Prepared): Pick<ComparedRun, 'reference' | 'points' | 'fitted'> {
  const { t, f, fit } = p;
  const n = t.length;
  const reference: ComparedRun['reference'] = fit ? { kind: 'f_inf', hz: fit.fInf } : { kind: 'mean', hz: n > 0 ? sampleMean(f) : 0 };
  const curve = (x: ArrayLike<number>, y: ArrayLike<number>): ComparisonCurve => ({
    t: Array.from(x),
    frequency: Array.from(y),
    deviation: Array.from(y, (v) => v - reference.hz),
  });
  const shown = n >= 3 ? downsampleLttb(t, f, MAX_SERIES_POINTS) : { x: Array.from(t), y: Array.from(f) };
  let fitted: ComparisonCurve | null = null;
  if (fit && n > 0) {
    const last = t[n - 1]!;
    const times = Array.from({ length: FITTED_POINTS }, (_, i) => (last * i) / (FITTED_POINTS - 1));
    fitted = curve(
      times,
      times.map((time) => evaluateWarmup(fit, time)),
    );
  }
  return { reference, points: curve(shown.x, shown.y), fitted };
}

type SensitivityBase = Omit<SupplySensitivityEntry, 'hzPerVolt' | 'seHzPerVolt' | 'n' | 'problem'>;

function supplyEntry(base: SensitivityBase, frequency: Float64Array, aux: Float64Array): SupplySensitivityEntry {
  const { volts, frequencies } = supplyPairs(frequency, aux);
  try {
    return { ...base, ...supplySensitivity(volts, frequencies), problem: null };
  } catch (error) {
    return { ...base, hzPerVolt: null, seHzPerVolt: null, n: volts.length, problem: `${problemText(error)} (each reading needs its supply voltage in aux)` };
  }
}

function keyingEntry(base: SensitivityBase, frequency: Float64Array, aux: Float64Array): KeyingEntry {
  const { up, down } = keyingSides(frequency, aux);
  try {
    return { ...base, shift: keyingShift(up, down), problem: null };
  } catch (error) {
    return { ...base, shift: null, problem: `${problemText(error)} (readings need aux 0 with the key up and 1 with it down)` };
  }
}

function round(value: number): number {
  return Math.round(value * 1000) / 1000;
}
