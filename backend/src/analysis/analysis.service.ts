import { BadRequestException, Injectable, UnprocessableEntityException } from '@nestjs/common';
import {
  alignLC,
  analyseCalibration,
  bisectionDrift,
  detectGaps,
  dialToNominal,
  downsampleLttb,
  driftRateWindows,
  evaluateWarmup,
  fillPhaseGaps,
  fitWarmup,
  fractionalFrequency,
  frequencyFromPhase,
  keyingShift,
  linearFrequencyDrift,
  longestContinuousSegment,
  madOutliers,
  MetrologyError,
  phaseFromFractionalFrequency,
  removeLinearFrequencyDrift,
  sampleMean,
  stabilityTable,
  supplySensitivity,
  threePointDrift,
  warmupSettling,
  warmupSummary,
  type CalibrationPoint,
  type DriftWindow,
  type StabilityPoint,
  type StabilityTableRow,
} from '@kilocycle/common/math';
import {
  MAX_LISTED_OUTLIERS,
  MAX_SERIES_POINTS,
  MAX_STABILITY_FACTORS,
  STABILITY_CONFIDENCE,
  type StabilityOutlierScreen,
  type StabilitySegment,
  type StabilityToolkit,
  type ReadyAnalysisBasis,
  type CalibrationRunAnalysis,
  type KeyingRunAnalysis,
  type RunAlignment,
  type RunAnalysis,
  type RunDataKind,
  type RunKind,
  type StabilityDrift,
  type StabilityRunAnalysis,
  type SupplySensitivityRunAnalysis,
  type WarmupRunAnalysis,
} from '@kilocycle/common/types';
import type { AuthUser } from '../shared/auth-user.js';
import type { InstrumentRange } from '../instruments/instrument-range.entity.js';
import { RunReadingsReader } from '../readings/run-readings.reader.js';
import { RunsService } from '../runs/runs.service.js';
import { LruCache } from './analysis-cache.js';
import type { RunAnalysisQueryDto } from './dto/analysis-query.dto.js';
import { includedByTime, RunSeriesLoader, type RunCounts, type RunSeries, type SeriesColumns } from './run-series.loader.js';

export const DEFAULT_SETTLING_WITHIN_HZ = 5;
export const DEFAULT_SETTLING_RATE_HZ_PER_MIN = 1;
export const DEFAULT_DRIFT_WINDOW_SECONDS = 600;
/** A range end counts as measured when a setting lies within this fraction of the dial span of it. */
const END_COVERAGE = 0.05;

@Injectable()
export class AnalysisService {
  private readonly results = new LruCache<RunAnalysis>(64);
  // The series themselves are large (41 MB for a million readings): keep only the last two.
  private readonly series = new LruCache<RunSeries>(2);

  constructor(
    private readonly runs: RunsService,
    private readonly loader: RunSeriesLoader,
    private readonly readings: RunReadingsReader,
  ) {}

  async analyse(actor: AuthUser, runId: number, query: RunAnalysisQueryDto): Promise<RunAnalysis> {
    const run = await this.runs.findVisible(actor, runId);
    const columns = seriesColumns(run.kind);
    // Nothing of this run is cached, so it must be read whatever it counts: read it while it is counted, sized by
    // the counter read with the run (a million readings grown from nothing cost a fifth of a second in copies).
    const runPrefix = `${runId}|`;
    const early =
      this.results.hasPrefix(runPrefix) || this.series.hasPrefix(runPrefix)
        ? null
        : this.loader.load(runId, run.readingCount, columns, keepsExcluded(run.kind));
    let counts: RunCounts;
    try {
      counts = await this.loader.counts(runId);
    } catch (error) {
      early?.catch(() => undefined);
      throw error;
    }
    const seriesKey = `${runId}|${counts.readingCount}|${counts.excludedCount}`;
    const resultKey = `${seriesKey}|${JSON.stringify(query)}`;
    const cached = this.results.get(resultKey);
    if (cached) return cached;

    let series = this.series.get(seriesKey);
    if (!series) {
      series = early ? await early : await this.loader.load(runId, counts.readingCount, columns, keepsExcluded(run.kind));
      // Readings that arrived while loading make a newer series; cache it under its own counts only.
      if (series.readingCount === counts.readingCount && series.excludedCount === counts.excludedCount) this.series.set(seriesKey, series);
    }
    const basis = (used: number): ReadyAnalysisBasis => ({
      runId,
      runKind: run.kind,
      readingCount: series.readingCount,
      excludedCount: series.excludedCount,
      usedCount: used,
      state: 'ready',
    });
    // No included reading yet (a run just opened, or every reading excluded) is a state, not an error: say so for every kind.
    const result: RunAnalysis =
      series.readingCount === series.excludedCount
        ? { ...basis(0), state: 'empty', analysis: 'none' }
        : await this.byKind(runId, run.kind, run.dataKind, run.range, series, basis, query);
    if (series.readingCount === counts.readingCount && series.excludedCount === counts.excludedCount) this.results.set(resultKey, result);
    return result;
  }

  /**
   * A run's included readings in time order, through the one loader and the same cache of the last series as
   * analyse(): what comparisons study per run. The columns read follow the run's kind, as analyse() reads them.
   */
  async includedSeries(runId: number, kind: RunKind): Promise<{ readingCount: number; t: Float64Array; frequency: Float64Array; aux: Float64Array }> {
    const counts = await this.loader.counts(runId);
    const seriesKey = `${runId}|${counts.readingCount}|${counts.excludedCount}`;
    let series = this.series.get(seriesKey);
    if (!series) {
      series = await this.loader.load(runId, counts.readingCount, seriesColumns(kind), keepsExcluded(kind));
      if (series.readingCount === counts.readingCount && series.excludedCount === counts.excludedCount) this.series.set(seriesKey, series);
    }
    return { readingCount: series.readingCount, ...includedByTime(series) };
  }

  private async byKind(
    runId: number,
    kind: RunKind,
    dataKind: RunDataKind,
    range: InstrumentRange,
    series: RunSeries,
    basis: (used: number) => ReadyAnalysisBasis,
    query: RunAnalysisQueryDto,
  ): Promise<RunAnalysis> {
    switch (kind) {
      case 'as_found':
      case 'as_left':
        return this.calibration(range, series, basis, query);
      case 'warmup':
        return this.warmup(series, basis, query);
      case 'stability':
        return this.stability(runId, dataKind, series, basis, query);
      case 'supply_sensitivity':
        return this.supply(series, basis);
      case 'keying':
        return this.keying(series, basis);
    }
  }

  private calibration(
    range: InstrumentRange,
    series: RunSeries,
    basis: (used: number) => ReadyAnalysisBasis,
    query: RunAnalysisQueryDto,
  ): CalibrationRunAnalysis {
    const readings: Array<{ dial: number; frequency: number; excluded: boolean }> = [];
    for (let i = 0; i < series.count; i++) {
      if (Number.isNaN(series.dial[i]!)) continue;
      readings.push({ dial: series.dial[i]!, frequency: series.frequency[i]!, excluded: series.excluded[i] === 1 });
    }
    const result = analyseCalibration({ law: range.dialLaw, tolerance: range.tolerance, readings });
    const { alignment, note } = this.alignment(range, result.points, query.tuningCapLowPf);
    return {
      ...basis(readings.filter((r) => !r.excluded).length),
      analysis: 'calibration',
      range: {
        id: range.id,
        label: range.label,
        dialUnit: range.dialUnit,
        dialMin: range.dialMin,
        dialMax: range.dialMax,
        freqMinHz: range.freqMinHz,
        freqMaxHz: range.freqMaxHz,
        tolerance: range.tolerance,
      },
      points: result.points,
      fit: result.fit,
      tracking: result.tracking,
      corrections: result.corrections,
      outliers: result.points.filter((p) => p.outlier).map((p) => ({ dial: p.dial, studentised: p.studentised! })),
      alignment,
      alignmentNote: note,
    };
  }

  /** alignLC from the measured points at the two range ends, with a mid-range point when there is one. */
  private alignment(
    range: InstrumentRange,
    points: CalibrationPoint[],
    tuningCapLowPf: number | undefined,
  ): { alignment: RunAlignment | null; note: string | null } {
    if (points.length < 2) return { alignment: null, note: 'measure both ends of the range to get the alignment' };
    try {
      const span = range.dialMax - range.dialMin;
      // Which dial end is the low-frequency one depends on the law (a table may run backwards).
      const lowEndDial = dialToNominal(range.dialLaw, range.dialMin) <= dialToNominal(range.dialLaw, range.dialMax) ? range.dialMin : range.dialMax;
      const highEndDial = lowEndDial === range.dialMin ? range.dialMax : range.dialMin;
      const byNominal = [...points].sort((a, b) => a.nominal - b.nominal);
      const low = byNominal[0]!;
      const high = byNominal[byNominal.length - 1]!;
      if (Math.abs(low.dial - lowEndDial) > END_COVERAGE * span || Math.abs(high.dial - highEndDial) > END_COVERAGE * span) {
        return { alignment: null, note: `the alignment needs settings at both ends of the range (dial ${lowEndDial} and ${highEndDial})` };
      }
      const middleTarget = (low.nominal + high.nominal) / 2;
      const inner = byNominal.slice(1, -1);
      const mid =
        inner.length === 0 ? null : inner.reduce((best, p) => (Math.abs(p.nominal - middleTarget) < Math.abs(best.nominal - middleTarget) ? p : best));
      const result = alignLC({
        lowMeasured: low.measured,
        lowTarget: low.nominal,
        highMeasured: high.measured,
        highTarget: high.nominal,
        ...(tuningCapLowPf !== undefined ? { tuningCapLowPf } : {}),
        ...(mid ? { midMeasured: mid.measured, midTarget: mid.nominal } : {}),
      });
      const end = (p: CalibrationPoint) => ({ dial: p.dial, target: p.nominal, measured: p.measured });
      return { alignment: { ...result, low: end(low), high: end(high), mid: mid ? end(mid) : null }, note: null };
    } catch (error) {
      // The calibration itself stands; only the alignment cannot be worked out from these readings.
      if (error instanceof MetrologyError) return { alignment: null, note: error.message };
      throw error;
    }
  }

  private warmup(series: RunSeries, basis: (used: number) => ReadyAnalysisBasis, query: RunAnalysisQueryDto): WarmupRunAnalysis {
    const { t, frequency } = includedByTime(series);
    const fit = fitWarmup(t, frequency, { linearTerm: query.linear === true });
    const withinHz = query.withinHz ?? DEFAULT_SETTLING_WITHIN_HZ;
    const rateHzPerMin = query.rateHzPerMin ?? DEFAULT_SETTLING_RATE_HZ_PER_MIN;
    const windowSeconds = query.windowSeconds ?? DEFAULT_DRIFT_WINDOW_SECONDS;
    let windows: DriftWindow[] = [];
    try {
      windows = driftRateWindows(t, frequency, windowSeconds);
    } catch (error) {
      // A record shorter than one window has no windowed rate; the fit still stands.
      if (!(error instanceof MetrologyError && error.code === 'too_short')) throw error;
    }
    const shown = downsampleLttb(t, frequency, MAX_SERIES_POINTS);
    return {
      ...basis(t.length),
      analysis: 'warmup',
      fit,
      summary: warmupSummary(t, frequency, fit, { kind: 'within_hz', hz: withinHz }),
      settling: warmupSettling(t, fit, { withinHz, rateHzPerMin }),
      drift: { windowSeconds, windows },
      series: { t: shown.x, frequency: shown.y, fitted: shown.x.map((time) => evaluateWarmup(fit, time)) },
    };
  }

  /**
   * A stability run: the deviations at each τ (ADEV, MDEV, HDEV, TDEV, TOTDEV with terms, the noise named, edf and
   * 95 % interval), the linear frequency drift (with SP 1065's three-point and bisection estimates from phase beside
   * it), optionally removed first, over the longest continuous segment by default (or every reading as if continuous,
   * flagged; or, for phase data, every reading with the gaps filled by straight lines in phase), and the readings the
   * MAD screen flags. Frequency readings become fractional frequency against the reference; phase (time-interval)
   * readings become fractional frequency by their first differences. All the math is common's.
   */
  private async stability(
    runId: number,
    dataKind: RunDataKind,
    series: RunSeries,
    basis: (used: number) => ReadyAnalysisBasis,
    query: RunAnalysisQueryDto,
  ): Promise<StabilityRunAnalysis> {
    const { t, frequency: values, seq } = includedByTime(series);
    const phase = dataKind === 'phase';
    const least = phase ? 4 : 3;
    if (t.length < least) {
      throw new MetrologyError(
        'too_few_points',
        `a stability analysis requires at least ${least} ${phase ? 'phase' : 'frequency'} readings (the run has ${t.length})`,
      );
    }
    // The basic interval is the median spacing; gaps are then judged against it.
    const tau0 = detectGaps(t, 1).medianInterval;
    if (!(tau0 > 0)) throw new MetrologyError('not_sorted', 'the readings of this run share one time stamp, so they have no interval');
    const gaps = detectGaps(t, tau0);
    const gapChoice = query.gaps ?? 'longest';
    if (phase && query.referenceHz !== undefined) {
      throw new MetrologyError(
        'bad_argument',
        'referenceHz: this run holds phase readings, which are already time error against the counter’s reference; no reference frequency applies',
      );
    }
    if (gapChoice === 'fill' && !phase) {
      throw new MetrologyError(
        'phase_only',
        'gaps=fill: gaps are filled in phase data only, and this run holds frequency readings (filling them would invent phase); analyse the longest continuous segment',
      );
    }
    if (gapChoice === 'continuous' && phase && gaps.gaps.length > 0) {
      throw new MetrologyError(
        'bad_argument',
        `gaps=continuous: this is a phase run with ${gaps.gaps.length} gap${gaps.gaps.length === 1 ? '' : 's'}, and its phase jumps across each one, so it cannot be analysed as if continuous; choose the longest continuous segment or fill the gaps`,
      );
    }
    const factors = factorList(query.m);
    const { start, end, leftOut } =
      gapChoice === 'longest' && gaps.gaps.length > 0 ? longestContinuousSegment(values, gaps.gaps) : { start: 0, end: t.length, leftOut: 0 };
    const count = end - start;
    // Phase with its gaps filled (fill), or the segment's readings as they are; `place` maps each analysed phase point to its reading (−1 where filled).
    const filled = gapChoice === 'fill' && gaps.gaps.length > 0 ? fillPhaseGaps({ kind: 'phase', values, gaps: gaps.gaps }) : null;
    const segment = segmentOf(gapChoice, t, start, end, leftOut, gaps.gaps.length, filled?.filled ?? 0);
    if (count < least) throw new MetrologyError('too_few_points', `${segment.statement}: a stability analysis requires at least ${least} readings`);
    const referenceHz = phase ? null : (query.referenceHz ?? sampleMean(values));
    let y: ArrayLike<number>;
    let x: ArrayLike<number>;
    if (phase) {
      x = filled ? filled.values : values.slice(start, end);
      y = frequencyFromPhase(x, tau0);
    } else {
      y = fractionalFrequency(values.subarray(start, end), referenceHz!);
      x = phaseFromFractionalFrequency(y, tau0);
    }
    const place = readingPlaces(phase, start, y.length, filled ? gaps.gaps : []);
    const drift = linearFrequencyDrift(y, tau0);
    const removed = query.drift === 'removed';
    const analysed = removed ? removeLinearFrequencyDrift(y, tau0).residuals : y;
    const deviations = stabilityTable(analysed, tau0, {
      ...(factors ? { factors } : { spacing: query.factors ?? 'octaves' }),
      confidence: STABILITY_CONFIDENCE,
    });
    const toolkit: StabilityToolkit = {
      dataKind,
      conversion: conversionOf(dataKind, referenceHz, filled?.filled ?? 0),
      confidence: STABILITY_CONFIDENCE,
      factors: { spacing: factors ? 'list' : (query.factors ?? 'octaves'), list: deviations.map((row) => row.m) },
      segment,
      drift: {
        method: 'linear_frequency',
        perSecond: drift.drift,
        standardError: drift.standardError,
        points: y.length,
        fromSeconds: segment.fromSeconds,
        toSeconds: segment.toSeconds,
        spansGap: (gapChoice === 'continuous' || gapChoice === 'fill') && gaps.gaps.length > 0,
        removed,
        phaseEstimates: phaseDriftEstimates(x, tau0),
      },
      deviations,
      outliers: await this.outliers(runId, analysed, place, t, values, seq),
    };
    const shown = downsampleLttb(t, values, MAX_SERIES_POINTS);
    return {
      ...basis(count),
      analysis: 'stability',
      tau0,
      referenceHz,
      adev: asStabilityPoints(deviations, 'adev'),
      mdev: asStabilityPoints(deviations, 'mdev'),
      gaps,
      series: { t: shown.x, frequency: shown.y },
      toolkit,
    };
  }

  /**
   * The MAD screen of the analysed fractional frequencies; the flagged readings listed with their ids, so each can be
   * excluded with a reason. `place` names the reading behind each analysed value.
   */
  private async outliers(
    runId: number,
    analysed: ArrayLike<number>,
    place: Int32Array,
    t: Float64Array,
    frequency: Float64Array,
    seq: Float64Array,
  ): Promise<StabilityOutlierScreen> {
    const screen = madOutliers(analysed);
    // A flagged value that stands for a filled point names no reading: it is counted, not listed.
    const listed = screen.indices
      .map((i) => place[i]!)
      .filter((i) => i >= 0)
      .slice(0, MAX_LISTED_OUTLIERS);
    const ids = await this.readings.idsAtSeqs(
      runId,
      listed.map((i) => seq[i]!),
    );
    return {
      k: screen.k,
      screened: analysed.length,
      median: screen.median,
      threshold: screen.threshold,
      flaggedCount: screen.indices.length,
      flagged: listed.map((i) => ({ readingId: ids.get(seq[i]!) ?? 0, seq: seq[i]!, t: t[i]!, frequency: frequency[i]! })),
    };
  }

  private supply(series: RunSeries, basis: (used: number) => ReadyAnalysisBasis): SupplySensitivityRunAnalysis {
    const { t, frequency, aux } = includedByTime(series);
    const { volts, frequencies } = supplyPairs(frequency, aux);
    if (volts.length === 0) throw new UnprocessableEntityException('a supply-sensitivity run needs the supply voltage of each reading in aux');
    const shown = downsampleLttb(t, frequency, MAX_SERIES_POINTS);
    return {
      ...basis(volts.length),
      analysis: 'supply_sensitivity',
      sensitivity: supplySensitivity(volts, frequencies),
      series: { t: shown.x, frequency: shown.y },
    };
  }

  private keying(series: RunSeries, basis: (used: number) => ReadyAnalysisBasis): KeyingRunAnalysis {
    const { t, frequency, aux } = includedByTime(series);
    const { up, down } = keyingSides(frequency, aux);
    if (up.length === 0 || down.length === 0) {
      throw new UnprocessableEntityException('a keying run needs readings with the key up (aux 0) and down (aux 1)');
    }
    const shown = downsampleLttb(t, frequency, MAX_SERIES_POINTS);
    return {
      ...basis(up.length + down.length),
      analysis: 'keying',
      shift: keyingShift(up, down),
      series: { t: shown.x, frequency: shown.y },
    };
  }
}

/** `m` as asked ("1,10,100", checked by the DTO to be positive whole numbers): ascending, each once; undefined when not given. */
function factorList(m: string | undefined): number[] | undefined {
  if (m === undefined) return undefined;
  const factors = [...new Set(m.split(',').map(Number))].sort((a, b) => a - b);
  if (factors.length > MAX_STABILITY_FACTORS) throw new BadRequestException(`m: at most ${MAX_STABILITY_FACTORS} averaging factors (got ${factors.length})`);
  return factors;
}

/** What was analysed, in numbers and in one sentence. */
function segmentOf(
  choice: StabilitySegment['choice'],
  t: Float64Array,
  start: number,
  end: number,
  leftOut: number,
  gapCount: number,
  filled: number,
): StabilitySegment {
  const count = end - start;
  const fromSeconds = t[start]!;
  const toSeconds = t[end - 1]!;
  const span = `${fromSeconds} s to ${toSeconds} s`;
  const gapWords = `${gapCount} gap${gapCount === 1 ? '' : 's'}`;
  const statement =
    gapCount === 0
      ? `every included reading: ${count}, ${span}, no gaps`
      : choice === 'longest'
        ? `the longest continuous segment: ${count} of ${t.length} included readings, ${span}; ${leftOut} beyond the ${gapWords} left out`
        : choice === 'fill'
          ? `every included reading (${count}, ${span}) with the ${gapWords} filled by straight lines in phase: ${filled} point${filled === 1 ? '' : 's'} filled`
          : `every included reading (${count}, ${span}) as if continuous, across ${gapWords}: deviations and drift mix readings either side of a gap`;
  return { choice, count, leftOut, fromSeconds, toSeconds, gapCount, filled, statement };
}

/** How the readings became what the deviations need, in one sentence (NIST SP 1065's conversions). */
function conversionOf(dataKind: RunDataKind, referenceHz: number | null, filled: number): string {
  if (dataKind === 'frequency') {
    return `computed from frequency data: each reading f (Hz) as fractional frequency y = (f − ${referenceHz} Hz)/${referenceHz} Hz; the Hadamard, time and total deviations from the phase x = Σ y·τ0 (s)`;
  }
  const fill = filled > 0 ? `, with ${filled} phase point${filled === 1 ? '' : 's'} filled by straight lines across the gaps` : '';
  return `computed from phase data: each reading a time interval x (s)${fill}; fractional frequency y_i = (x_{i+1} − x_i)/τ0 for the Allan and modified Allan deviations, the drift line and the outlier screen`;
}

/** SP 1065's phase-data drift estimates beside the line: the three-point fit and the bisection estimate (null when too short for either). */
function phaseDriftEstimates(x: ArrayLike<number>, tau0: number): StabilityDrift['phaseEstimates'] {
  try {
    return { threePoint: { perSecond: threePointDrift(x, tau0).drift }, bisection: { perSecond: bisectionDrift(x, tau0).drift } };
  } catch (error) {
    if (error instanceof MetrologyError && error.code === 'too_few_points') return null;
    throw error;
  }
}

/**
 * The included reading (index into the time-ordered series) behind each analysed fractional frequency: for frequency
 * data the reading itself; for phase data y_i spans readings i and i + 1, and names the later one (the earlier one
 * where the later was filled; −1 when both were filled). `gaps` are the filled gaps (none unless filled).
 */
function readingPlaces(phase: boolean, start: number, count: number, gaps: ReadonlyArray<{ index: number; missing: number }>): Int32Array {
  const place = new Int32Array(count);
  if (!phase) {
    for (let i = 0; i < count; i++) place[i] = start + i;
    return place;
  }
  // Phase point j (after filling) → reading index, −1 where filled.
  const points = new Int32Array(count + 1);
  let reading = start;
  let j = 0;
  for (const gap of gaps) {
    while (reading < gap.index && j <= count) points[j++] = reading++;
    for (let k = 0; k < gap.missing && j <= count; k++) points[j++] = -1;
  }
  while (j <= count) points[j++] = reading++;
  for (let i = 0; i < count; i++) place[i] = points[i + 1]! >= 0 ? points[i + 1]! : points[i]!;
  return place;
}

/** The toolkit's rows as the earlier ADEV and MDEV lists (the same numbers, 95 % intervals). */
function asStabilityPoints(rows: StabilityTableRow[], deviation: 'adev' | 'mdev'): StabilityPoint[] {
  return rows.flatMap((row) => {
    const value = row[deviation];
    return value ? [{ m: row.m, tau: row.tau, deviation: value.deviation, n: value.terms, edf: value.edf, ciLow: value.ciLow, ciHigh: value.ciHigh }] : [];
  });
}

/** The optional columns an analysis of this kind reads: the dial for a calibration, aux for supply and keying runs. */
function seriesColumns(kind: RunKind): SeriesColumns {
  return { dial: kind === 'as_found' || kind === 'as_left', aux: kind === 'supply_sensitivity' || kind === 'keying' };
}

/** A calibration shows its excluded readings; the time-series kinds only count them. */
function keepsExcluded(kind: RunKind): boolean {
  return kind === 'as_found' || kind === 'as_left';
}

/** The included readings that carry a supply voltage (aux), as voltage and frequency pairs. */
export function supplyPairs(frequency: ArrayLike<number>, aux: ArrayLike<number>): { volts: number[]; frequencies: number[] } {
  const volts: number[] = [];
  const frequencies: number[] = [];
  for (let i = 0; i < frequency.length; i++) {
    if (Number.isNaN(aux[i]!)) continue;
    volts.push(aux[i]!);
    frequencies.push(frequency[i]!);
  }
  return { volts, frequencies };
}

/** The included readings with the key up (aux 0) and down (aux 1). */
export function keyingSides(frequency: ArrayLike<number>, aux: ArrayLike<number>): { up: number[]; down: number[] } {
  const up: number[] = [];
  const down: number[] = [];
  for (let i = 0; i < frequency.length; i++) {
    if (aux[i] === 0) up.push(frequency[i]!);
    else if (aux[i] === 1) down.push(frequency[i]!);
  }
  return { up, down };
}
