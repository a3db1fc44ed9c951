import {
  analyseCalibration,
  combineUncertainty,
  decide,
  dialSlope,
  dialToNominal,
  DISTRIBUTION_DIVISORS,
  frequencyBudget,
  jobOutcomes,
  ppmToHz,
  roundResultToUncertainty,
  toleranceHz,
  type CalibrationAnalysis,
  type CalibrationPoint,
  type UncertaintyComponent,
} from '@kilocycle/common/math';
import type {
  BudgetLine,
  Decision,
  DecisionRule,
  DialUnit,
  ExtraComponent,
  JobResults,
  MeasuredPoint,
  PointBudget,
  PointResult,
  RangeResult,
  ReviewFlag,
  RunKind,
  StandardReference,
} from '@kilocycle/common/types';
import type { ResultsRange } from '../instruments/range-results.reader.js';
import type { ResultsReading } from '../readings/reading-results.reader.js';
import type { CalibrationRunRow, JobResultsInput, ProcedureFigures, RunOverrides } from './job-results.reader.js';

/** Order of severity: the worst decision of a set is the one latest in this list. */
const DECISION_ORDER: readonly Decision[] = ['pass', 'conditional_pass', 'conditional_fail', 'fail'];

// Said as computed (common's decide() with U = k·u_c before rounding): strict and closed boundaries, and the
// false-accept figure ILAC-G8 4.2.2 gives, which is the probability beyond the limit nearer the result.
const RULE_WORDS: Record<DecisionRule, string> = {
  simple:
    'Simple acceptance (ILAC-G8:09/2019, 4.2.1): a point conforms when its error lies within the tolerance, limits included; no guard band (w = 0). ' +
    'For a result close to a limit the probability of a false accept can approach 50 %.',
  guarded_binary:
    'Guarded acceptance (ILAC-G8:09/2019, 4.2.2) with guard band w = U: a point conforms when the size of its error is less than the tolerance less U, ' +
    'otherwise it does not conform. The guard band uses U as calculated, before it is rounded to the two digits printed. ' +
    'For a conforming point the probability that its true error lies beyond the nearer tolerance limit is below 2.5 %.',
  guarded:
    'Guarded acceptance with four outcomes (ILAC-G8:09/2019, 4.2.3), guard band w = U: pass when the size of the error is less than the tolerance less U; ' +
    'conditional pass from there to the tolerance, limits included; conditional fail above the tolerance up to the tolerance plus U; fail beyond. ' +
    'The guard band uses U as calculated, before it is rounded to the two digits printed. ' +
    'For a pass the probability that the true error lies beyond the nearer tolerance limit is below 2.5 %; for a conditional pass it can approach 50 %.',
};

export function decisionRuleText(rule: DecisionRule): string {
  return RULE_WORDS[rule];
}

export function worstDecision(decisions: ReadonlyArray<Decision | null>): Decision | null {
  let worst: Decision | null = null;
  for (const d of decisions) {
    if (d === null) continue;
    if (worst === null || DECISION_ORDER.indexOf(d) > DECISION_ORDER.indexOf(worst)) worst = d;
  }
  return worst;
}

/** The budget figures that apply to a run: its overrides where set, else the procedure's. */
export function effectiveFigures(procedure: ProcedureFigures, overrides: RunOverrides | null, dialSpan: number) {
  return {
    dialHalfDivision: overrides?.dialHalfDivision ?? (procedure.dialHalfDivisionPercentOfSpan / 100) * Math.abs(dialSpan),
    driftPpm: overrides?.driftPpm ?? procedure.driftPpm,
    driftHz: overrides?.driftHz ?? procedure.driftHz,
    counterResolutionHz: overrides?.counterResolutionHz ?? null,
    extraComponents: overrides?.extraComponents ?? procedure.extraComponents,
  };
}

function extraToComponent(extra: ExtraComponent, nominalHz: number): UncertaintyComponent {
  const valueHz = extra.unit === 'ppm' ? ppmToHz(extra.value, nominalHz) : extra.value;
  const divisor = extra.distribution === 'normal' ? (extra.divisor ?? 1) : DISTRIBUTION_DIVISORS[extra.distribution];
  return { name: extra.name, kind: 'B', distribution: extra.distribution, value: valueHz, divisor, sensitivity: 1, dof: extra.dof ?? null };
}

export type BudgetInputs = {
  nominalHz: number;
  samples: readonly number[];
  standard: StandardReference;
  figures: ReturnType<typeof effectiveFigures>;
  slopeHzPerDialUnit: number;
  dialUnit: DialUnit;
};

/** One point's budget: common's frequencyBudget plus the procedure's extra lines, combined by common. */
export function pointBudget(input: BudgetInputs): PointBudget {
  const { components, notes } = frequencyBudget({
    nominalHz: input.nominalHz,
    measuredSamples: input.samples,
    standardAccuracyPpm: input.standard.timebaseAccuracyPpm,
    counterResolutionHz: input.figures.counterResolutionHz ?? input.standard.resolutionHz,
    dialHalfDivision: input.figures.dialHalfDivision,
    dialSlopeHzPerDiv: input.slopeHzPerDialUnit,
    driftHz: ppmToHz(input.figures.driftPpm, input.nominalHz) + input.figures.driftHz,
    standardCalUHz: ppmToHz(input.standard.calibrationUPpm, input.nominalHz),
    standardCalK: input.standard.calibrationK,
  });
  const all = [...components, ...input.figures.extraComponents.map((extra) => extraToComponent(extra, input.nominalHz))];
  const combined = combineUncertainty(all);
  const lines: BudgetLine[] = combined.components.map((c) => ({
    name: c.name,
    kind: c.kind,
    distribution: c.distribution,
    value: c.value,
    unit: c.name.startsWith('Dial') ? input.dialUnit : 'Hz',
    divisor: c.divisor,
    sensitivity: c.sensitivity,
    standardUncertainty: c.standardUncertainty,
    contributionHz: c.contribution,
    dof: c.dof,
  }));
  return {
    lines,
    ucHz: combined.uc,
    nuEff: Number.isFinite(combined.nuEff) ? combined.nuEff : null,
    k: combined.k,
    U: combined.U,
    Uunrounded: combined.Uunrounded,
    coverage: combined.coverage,
    notes,
  };
}

function message(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

/** What the steps of one job's results share: the loaded input, the runs' readings and what is collected on the way. */
type Context = {
  input: JobResultsInput;
  readingsByRun: Map<number, ResultsReading[]>;
  flags: ReviewFlag[];
  standards: Map<number, StandardReference>;
};

type AnalysedRun = { run: CalibrationRunRow; analysis: CalibrationAnalysis; points: Map<number, MeasuredPoint> };

/**
 * Everything a job's certificate states, computed from its as-found and as-left runs (loaded by
 * JobResultsReader): per range and setting the nominal, the measured means, errors, tolerance, the
 * uncertainty budget (common's frequencyBudget and combineUncertainty), U with k and ν_eff, the decision
 * under the procedure's rule and the TUR. Runs of one kind repeated on a range: the latest run with
 * readings is used, the others are flagged. Pure: no reads.
 */
export function assembleJobResults(input: JobResultsInput): JobResults {
  const readingsByRun = new Map<number, ResultsReading[]>();
  for (const reading of input.readings) readingsByRun.set(reading.runId, [...(readingsByRun.get(reading.runId) ?? []), reading]);
  const context: Context = { input, readingsByRun, flags: [], standards: new Map() };
  const rangeResults = input.ranges.flatMap((range) => rangeResult(context, range) ?? []);
  if (rangeResults.length === 0) {
    context.flags.push({ kind: 'no_calibration_run', severity: 'blocker', message: 'the job has no as-found or as-left run with readings' });
  }
  const { job, procedure } = input;
  const rule = procedure.decisionRule;
  return {
    jobId: job.id,
    jobNumber: job.number,
    jobStatus: job.status,
    procedure: { id: procedure.id, name: procedure.name, method: procedure.method, decisionRule: procedure.decisionRule },
    decisionRule: rule,
    decisionRuleText: decisionRuleText(rule),
    ranges: rangeResults,
    standards: [...context.standards.values()],
    decision: worstDecision(rangeResults.map((r) => r.decision)),
    outcomes: jobOutcomes(rangeResults),
    flags: context.flags,
  };
}

/** One range's results, or null when neither an as-found nor an as-left run with readings was taken on it. */
function rangeResult(context: Context, range: ResultsRange): RangeResult | null {
  const asFoundRun = pickRun(context, range, 'as_found');
  const asLeftRun = pickRun(context, range, 'as_left');
  if (!asFoundRun && !asLeftRun) return null;
  if (asFoundRun && !asLeftRun) {
    context.flags.push({
      kind: 'no_as_left',
      severity: 'info',
      rangeId: range.id,
      message: `${range.label}: as-found only (no adjustment recorded); the as-found results are the final ones`,
    });
  }
  const problems: string[] = [];
  const found = asFoundRun ? analyseRun(context, range, asFoundRun, problems) : null;
  const left = asLeftRun ? analyseRun(context, range, asLeftRun, problems) : null;
  const points = mergePoints(context, range, found, left, problems);
  const fitOf = (a: AnalysedRun | null) => (a ? { runId: a.run.id, fit: a.analysis.fit, tracking: a.analysis.tracking } : null);
  return {
    rangeId: range.id,
    position: range.position,
    label: range.label,
    dialUnit: range.dialUnit,
    dialMin: range.dialMin,
    dialMax: range.dialMax,
    freqMinHz: range.freqMinHz,
    freqMaxHz: range.freqMaxHz,
    tolerance: range.tolerance,
    asFoundRunId: asFoundRun?.id ?? null,
    asLeftRunId: asLeftRun?.id ?? null,
    asFoundFit: fitOf(found),
    asLeftFit: fitOf(left),
    points,
    decision: worstDecision(points.map((p) => (p.asLeft ?? p.asFound)?.decision ?? null)),
    problems,
  };
}

/** The latest run of a kind on the range with an included reading; the others of that kind are flagged. */
function pickRun(context: Context, range: ResultsRange, kind: RunKind): CalibrationRunRow | null {
  const candidates = context.input.runs.filter((r) => r.rangeId === range.id && r.kind === kind);
  const usable = candidates.filter((r) => (context.readingsByRun.get(r.id) ?? []).some((x) => x.excludedReason === null && x.dial !== null));
  const chosen = usable.length > 0 ? usable[usable.length - 1]! : null;
  for (const other of candidates) {
    if (chosen && other.id !== chosen.id) {
      context.flags.push({
        kind: 'extra_run',
        severity: 'info',
        runId: other.id,
        rangeId: range.id,
        message: `${kind.replace('_', '-')} run ${other.id} on ${range.label} is not used: run ${chosen.id} is the latest with readings`,
      });
    }
  }
  return chosen;
}

/** A run's calibration analysis and, per setting, its measured point with budget and decision (null when it cannot be analysed). */
function analyseRun(context: Context, range: ResultsRange, run: CalibrationRunRow, problems: string[]): AnalysedRun | null {
  const runReadings = (context.readingsByRun.get(run.id) ?? []).filter((r) => r.dial !== null);
  flagRun(context, range, run, runReadings);
  let analysis: CalibrationAnalysis;
  try {
    analysis = analyseCalibration({
      law: range.dialLaw,
      tolerance: range.tolerance,
      readings: runReadings.map((r) => ({ dial: r.dial!, frequency: r.frequency, excluded: r.excludedReason !== null })),
    });
  } catch (error) {
    problems.push(`run ${run.id}: ${message(error)}`);
    context.flags.push({
      kind: 'computation',
      severity: 'blocker',
      runId: run.id,
      rangeId: range.id,
      message: `run ${run.id} on ${range.label} cannot be analysed: ${message(error)}`,
    });
    return null;
  }
  const samples = settingSamples(context, runReadings);
  const figures = effectiveFigures(context.input.procedure, run.overrides, range.dialMax - range.dialMin);
  const points = new Map<number, MeasuredPoint>();
  for (const p of analysis.points) points.set(p.dial, measuredPoint(context, range, run, p, samples.get(p.dial) ?? [p.measured], figures));
  return { run, analysis, points };
}

/** The run's excluded readings and its standard (missing, overdue, used by override) as flags; the standard joins the job's list. */
function flagRun(context: Context, range: ResultsRange, run: CalibrationRunRow, runReadings: readonly ResultsReading[]): void {
  const { flags } = context;
  for (const r of runReadings) {
    if (r.excludedReason !== null) {
      flags.push({
        kind: 'excluded_reading',
        severity: 'info',
        runId: run.id,
        rangeId: range.id,
        readingId: r.id,
        dial: r.dial ?? undefined,
        message: `reading #${r.seq} of run ${run.id} excluded: ${r.excludedReason}`,
      });
    }
  }
  if (run.standard) {
    context.standards.set(run.standard.id, run.standard);
    if (run.standard.dueDate < run.startedAt.toISOString().slice(0, 10)) {
      flags.push({
        kind: 'standard_overdue',
        severity: 'warning',
        runId: run.id,
        rangeId: range.id,
        message: `standard ${run.standard.name} was past its due date (${run.standard.dueDate}) when run ${run.id} started`,
      });
    }
  } else {
    flags.push({
      kind: 'no_standard',
      severity: 'blocker',
      runId: run.id,
      rangeId: range.id,
      message: `run ${run.id} on ${range.label} names no reference standard: no uncertainty can be stated`,
    });
  }
  if (run.standardOverrideReason) {
    flags.push({
      kind: 'standard_override',
      severity: 'warning',
      runId: run.id,
      rangeId: range.id,
      message: `run ${run.id} used an overdue standard by override: ${run.standardOverrideReason}`,
    });
  }
}

/** Per dial setting, the values behind its repeatability: each included reading, or the counter readings behind a counter-assisted one. */
function settingSamples(context: Context, runReadings: readonly ResultsReading[]): Map<number, number[]> {
  const samples = new Map<number, number[]>();
  for (const r of runReadings) {
    if (r.excludedReason !== null) continue;
    const key = r.dial === 0 ? 0 : r.dial!;
    samples.set(key, [...(samples.get(key) ?? []), ...(context.input.counterSamples.get(r.id) ?? [r.frequency])]);
  }
  return samples;
}

/** One setting of one run: the measured figures, then its budget, decision and rounded error when the run names a standard. */
function measuredPoint(
  context: Context,
  range: ResultsRange,
  run: CalibrationRunRow,
  p: CalibrationPoint,
  samples: readonly number[],
  figures: ReturnType<typeof effectiveFigures>,
): MeasuredPoint {
  const tolHz = p.toleranceHz ?? toleranceHz(range.tolerance, p.nominal);
  const measured: MeasuredPoint = {
    runId: run.id,
    measured: p.measured,
    n: p.n,
    sd: p.sd,
    errorHz: p.errorHz,
    errorPpm: p.errorPpm,
    errorRounded: p.errorHz,
    decimals: 1,
    outlier: p.outlier,
    // ±Infinity (the other points exactly on a line) does not survive JSON: kept as null, the flag says it.
    studentised: p.studentised !== null && Number.isFinite(p.studentised) ? p.studentised : null,
    budget: null,
    decision: null,
    tur: null,
    turFlag: false,
    guardBandHz: null,
    acceptanceLimitHz: null,
    problem: null,
  };
  if (p.outlier) {
    context.flags.push({
      kind: 'outlier',
      severity: 'warning',
      runId: run.id,
      rangeId: range.id,
      dial: p.dial,
      message: `run ${run.id}, dial ${p.dial}: studentised residual ${p.studentised?.toFixed(1)} (above 3); check the reading`,
    });
  }
  if (!run.standard) {
    measured.problem = 'no reference standard recorded for the run';
    return measured;
  }
  try {
    const span = range.dialMax - range.dialMin;
    const budget = pointBudget({
      nominalHz: p.nominal,
      samples,
      standard: run.standard,
      figures,
      slopeHzPerDialUnit: dialSlope(range.dialLaw, p.dial, span),
      dialUnit: range.dialUnit,
    });
    // ILAC-G8: w, the acceptance limit and the TUR take U as computed; the two-digit U is only printed.
    const decision = decide({ errorHz: p.errorHz, toleranceHz: tolHz, U: budget.Uunrounded, rule: context.input.procedure.decisionRule });
    const rounded = roundResultToUncertainty(p.errorHz, budget.U);
    Object.assign(measured, {
      budget,
      decision: decision.decision,
      tur: decision.tur,
      turFlag: decision.turFlag,
      guardBandHz: decision.guardBandHz,
      acceptanceLimitHz: decision.acceptanceLimitHz,
      errorRounded: rounded.value,
      decimals: rounded.decimals,
    });
  } catch (error) {
    measured.problem = message(error);
    context.flags.push({
      kind: 'computation',
      severity: 'blocker',
      runId: run.id,
      rangeId: range.id,
      dial: p.dial,
      message: `run ${run.id}, dial ${p.dial}: ${message(error)}`,
    });
  }
  return measured;
}

/** The range's settings in dial order with their as-found and as-left points; the final one's low TUR or non-conformity is flagged. */
function mergePoints(context: Context, range: ResultsRange, found: AnalysedRun | null, left: AnalysedRun | null, problems: string[]): PointResult[] {
  const dials = new Set<number>([...(found?.points.keys() ?? []), ...(left?.points.keys() ?? [])]);
  const points: PointResult[] = [];
  for (const dial of [...dials].sort((a, b) => a - b)) {
    let nominal: number;
    try {
      nominal = dialToNominal(range.dialLaw, dial);
    } catch (error) {
      problems.push(message(error));
      continue;
    }
    const asFound = found?.points.get(dial) ?? null;
    const asLeft = left?.points.get(dial) ?? null;
    const final = asLeft ?? asFound;
    if (final?.turFlag) {
      context.flags.push({
        kind: 'tur_low',
        severity: 'warning',
        runId: final.runId,
        rangeId: range.id,
        dial,
        message: `${range.label}, dial ${dial}: test uncertainty ratio ${final.tur?.toFixed(2)}:1 is below 4:1`,
      });
    }
    if (final?.decision && final.decision !== 'pass') {
      context.flags.push({
        kind: 'point_not_conforming',
        severity: 'warning',
        runId: final.runId,
        rangeId: range.id,
        dial,
        message: `${range.label}, dial ${dial}: ${final.decision.replace('_', ' ')}${asLeft ? '' : ' (as found)'}`,
      });
    }
    points.push({ dial, nominal, toleranceHz: toleranceHz(range.tolerance, nominal), asFound, asLeft });
  }
  return points;
}
