import {
  analyseCalibration,
  combineUncertainty,
  decide,
  dialToNominal,
  DISTRIBUTION_DIVISORS,
  frequencyBudget,
  jobOutcomes,
  roundResultToUncertainty,
  toleranceHz,
  type CalibrationAnalysis,
  type UncertaintyComponent,
} from '@kilocycle/common/math';
import type {
  BudgetLine,
  Decision,
  DecisionRule,
  DialLaw,
  DialUnit,
  ExtraComponent,
  JobResults,
  JobStatus,
  MeasuredPoint,
  PointBudget,
  PointResult,
  RangeResult,
  ReviewFlag,
  RunKind,
  StandardReference,
  Tolerance,
} from '@kilocycle/common/types';
import type { EntityManager } from 'typeorm';
import { jsonColumn } from '../shared/json-column.js';

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

export type ProcedureFigures = {
  id: number;
  /** The procedure's version these figures are (open jobs use the newest). */
  version: number;
  name: string;
  method: string;
  decisionRule: DecisionRule;
  dialHalfDivisionPercentOfSpan: number;
  driftPpm: number;
  driftHz: number;
  extraComponents: ExtraComponent[];
};

export type RunOverrides = {
  dialHalfDivision: number | null;
  driftPpm: number | null;
  driftHz: number | null;
  counterResolutionHz: number | null;
  extraComponents: ExtraComponent[] | null;
};

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

type JobRow = { id: number; number: string; status: JobStatus };
type RangeRow = {
  id: number;
  position: number;
  label: string;
  dialUnit: DialUnit;
  dialLaw: DialLaw;
  dialMin: number;
  dialMax: number;
  freqMinHz: number;
  freqMaxHz: number;
  tolerance: Tolerance;
};
export type CalibrationRunRow = {
  id: number;
  kind: RunKind;
  rangeId: number;
  startedAt: Date;
  standard: StandardReference | null;
  /** The version of the standard's row read here (the newest: the job is open). */
  standardVersion: number | null;
  standardOverrideReason: string | null;
  overrides: RunOverrides | null;
};
type ReadingRow = { id: number; runId: number; seq: number; dial: number | null; frequency: number; excludedReason: string | null };


/** The procedure a job uses: its chosen one, else the default, else the first active one. */
export async function loadJobProcedure(manager: EntityManager, jobId: number): Promise<ProcedureFigures> {
  const rows: Array<Record<string, unknown>> = await manager.query(
    `SELECT p.* FROM procedures p LEFT JOIN job_procedures jp ON jp.procedure_id = p.id AND jp.job_id = ?
      ORDER BY (jp.job_id IS NOT NULL) DESC, p.is_default DESC, p.active DESC, p.id ASC LIMIT 1`,
    [jobId],
  );
  const row = rows[0];
  if (!row) throw new Error('no calibration procedure is defined; a lead must create one first');
  return {
    id: Number(row.id),
    version: Number(row.version),
    name: String(row.name),
    method: String(row.method),
    decisionRule: row.decision_rule as DecisionRule,
    dialHalfDivisionPercentOfSpan: Number(row.dial_half_division_pct),
    driftPpm: Number(row.drift_ppm),
    driftHz: Number(row.drift_hz),
    extraComponents: jsonColumn<ExtraComponent[]>(row.extra_components) ?? [],
  };
}

export async function loadCalibrationRuns(manager: EntityManager, jobId: number): Promise<CalibrationRunRow[]> {
  const rows: Array<Record<string, unknown>> = await manager.query(
    `SELECT r.id, r.kind, r.range_id, r.started_at, r.standard_override_reason,
            s.id AS s_id, s.name AS s_name, s.make_model, s.serial AS s_serial, s.certificate_number,
            DATE_FORMAT(s.due_date, '%Y-%m-%d') AS s_due, s.timebase_accuracy_ppm, s.resolution_hz, s.calibration_u_ppm, s.calibration_k, s.version AS s_version,
            b.run_id AS b_run, b.dial_half_division, b.drift_ppm, b.drift_hz, b.counter_resolution_hz, b.extra_components
       FROM runs r
       LEFT JOIN standards s ON s.id = r.standard_id
       LEFT JOIN run_budgets b ON b.run_id = r.id
      WHERE r.job_id = ? AND r.kind IN ('as_found', 'as_left')
      ORDER BY r.started_at, r.id`,
    [jobId],
  );
  const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
  return rows.map((row) => ({
    id: Number(row.id),
    kind: row.kind as RunKind,
    rangeId: Number(row.range_id),
    startedAt: new Date(row.started_at as string),
    standardOverrideReason: (row.standard_override_reason as string | null) ?? null,
    standardVersion: row.s_id === null ? null : Number(row.s_version),
    standard:
      row.s_id === null
        ? null
        : {
            id: Number(row.s_id),
            name: String(row.s_name),
            makeModel: String(row.make_model),
            serial: String(row.s_serial),
            certificateNumber: String(row.certificate_number),
            dueDate: String(row.s_due),
            timebaseAccuracyPpm: Number(row.timebase_accuracy_ppm),
            resolutionHz: Number(row.resolution_hz),
            calibrationUPpm: Number(row.calibration_u_ppm),
            calibrationK: Number(row.calibration_k),
          },
    overrides:
      row.b_run === null
        ? null
        : {
            dialHalfDivision: num(row.dial_half_division),
            driftPpm: num(row.drift_ppm),
            driftHz: num(row.drift_hz),
            counterResolutionHz: num(row.counter_resolution_hz),
            extraComponents: row.extra_components === null ? null : jsonColumn<ExtraComponent[]>(row.extra_components),
          },
  }));
}

/** Local slope of the dial law, Hz per dial unit (central difference; one-sided at a table's ends). */
export function dialSlope(law: DialLaw, dial: number, dialSpan: number): number {
  const h = Math.max(Math.abs(dialSpan) * 1e-4, 1e-9);
  const at = (d: number): number | null => {
    try {
      return dialToNominal(law, d);
    } catch {
      return null;
    }
  };
  const centre = at(dial);
  const above = at(dial + h);
  const below = at(dial - h);
  if (above !== null && below !== null) return (above - below) / (2 * h);
  if (above !== null && centre !== null) return (above - centre) / h;
  if (below !== null && centre !== null) return (centre - below) / h;
  throw new Error(`the dial law gives no slope at dial ${dial}`);
}

function extraToComponent(extra: ExtraComponent, nominalHz: number): UncertaintyComponent {
  const valueHz = extra.unit === 'ppm' ? extra.value * 1e-6 * nominalHz : extra.value;
  const divisor =
    extra.distribution === 'normal' ? (extra.divisor ?? 1) : DISTRIBUTION_DIVISORS[extra.distribution];
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
    driftHz: input.figures.driftPpm * 1e-6 * input.nominalHz + input.figures.driftHz,
    standardCalUHz: input.standard.calibrationUPpm * 1e-6 * input.nominalHz,
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

/**
 * Everything a job's certificate states, computed from its as-found and as-left runs: per range and
 * setting the nominal, the measured means, errors, tolerance, the uncertainty budget (common's
 * frequencyBudget and combineUncertainty), U with k and ν_eff, the decision under the procedure's rule
 * and the TUR. Runs of one kind repeated on a range: the latest run with readings is used, the others are
 * flagged. Pure reads: safe inside the signing transaction.
 */
export async function computeJobResults(manager: EntityManager, jobId: number): Promise<JobResults> {
  const [job] = (await manager.query('SELECT id, number, status, instrument_id FROM jobs WHERE id = ?', [jobId])) as Array<JobRow & { instrument_id: number }>;
  if (!job) throw new Error(`job ${jobId} not found`);
  const procedure = await loadJobProcedure(manager, jobId);
  const rule = procedure.decisionRule;
  const runs = await loadCalibrationRuns(manager, jobId);
  const rangeRows: Array<Record<string, unknown>> = await manager.query(
    `SELECT id, position, label, dial_unit, dial_law, dial_min, dial_max, freq_min_hz, freq_max_hz, tolerance
       FROM instrument_ranges WHERE instrument_id = ? ORDER BY position`,
    [job.instrument_id],
  );
  const ranges: RangeRow[] = rangeRows.map((r) => ({
    id: Number(r.id),
    position: Number(r.position),
    label: String(r.label),
    dialUnit: r.dial_unit as DialUnit,
    dialLaw: jsonColumn<DialLaw>(r.dial_law),
    dialMin: Number(r.dial_min),
    dialMax: Number(r.dial_max),
    freqMinHz: Number(r.freq_min_hz),
    freqMaxHz: Number(r.freq_max_hz),
    tolerance: jsonColumn<Tolerance>(r.tolerance),
  }));
  const readings: ReadingRow[] =
    runs.length === 0
      ? []
      : ((await manager.query(
          `SELECT r.id, r.run_id, r.seq, r.dial, r.frequency_hz, e.reason
             FROM readings r LEFT JOIN reading_exclusions e ON e.reading_id = r.id
            WHERE r.run_id IN (?) ORDER BY r.run_id, r.seq`,
          [runs.map((r) => r.id)],
        )) as Array<Record<string, unknown>>).map((r) => ({
          id: Number(r.id),
          runId: Number(r.run_id),
          seq: Number(r.seq),
          dial: r.dial === null ? null : Number(r.dial),
          frequency: Number(r.frequency_hz),
          excludedReason: (r.reason as string | null) ?? null,
        }));
  // A setting taken with the counter's help is one reading (the mean) linked to the counter readings behind
  // it: the budget's repeatability takes their spread (s/√n over those n), not that of the one mean.
  const counterSamples = new Map<number, number[]>();
  if (runs.length > 0) {
    const linked = (await manager.query(
      `SELECT c.reading_id, s.frequency_hz FROM counter_captures c
         JOIN counter_capture_samples cs ON cs.capture_id = c.id JOIN readings s ON s.id = cs.reading_id
        WHERE c.run_id IN (?) ORDER BY s.seq`,
      [runs.map((r) => r.id)],
    )) as Array<{ reading_id: number | string; frequency_hz: number }>;
    for (const row of linked) {
      const id = Number(row.reading_id);
      counterSamples.set(id, [...(counterSamples.get(id) ?? []), Number(row.frequency_hz)]);
    }
  }
  const readingsByRun = new Map<number, ReadingRow[]>();
  for (const reading of readings) {
    const list = readingsByRun.get(reading.runId) ?? [];
    list.push(reading);
    readingsByRun.set(reading.runId, list);
  }

  const flags: ReviewFlag[] = [];
  const standards = new Map<number, StandardReference>();
  const rangeResults: RangeResult[] = [];

  for (const range of ranges) {
    const pick = (kind: RunKind) => {
      const candidates = runs.filter((r) => r.rangeId === range.id && r.kind === kind);
      const usable = candidates.filter((r) => (readingsByRun.get(r.id) ?? []).some((x) => x.excludedReason === null && x.dial !== null));
      const chosen = usable.length > 0 ? usable[usable.length - 1]! : null;
      for (const other of candidates) {
        if (chosen && other.id !== chosen.id) {
          flags.push({ kind: 'extra_run', severity: 'info', runId: other.id, rangeId: range.id, message: `${kind.replace('_', '-')} run ${other.id} on ${range.label} is not used: run ${chosen.id} is the latest with readings` });
        }
      }
      return chosen;
    };
    const asFoundRun = pick('as_found');
    const asLeftRun = pick('as_left');
    if (!asFoundRun && !asLeftRun) continue;
    if (asFoundRun && !asLeftRun) {
      flags.push({ kind: 'no_as_left', severity: 'info', rangeId: range.id, message: `${range.label}: as-found only (no adjustment recorded); the as-found results are the final ones` });
    }
    const problems: string[] = [];
    const span = range.dialMax - range.dialMin;

    const analyse = (run: CalibrationRunRow | null) => {
      if (!run) return null;
      const runReadings = (readingsByRun.get(run.id) ?? []).filter((r) => r.dial !== null);
      for (const r of runReadings) {
        if (r.excludedReason !== null) {
          flags.push({ kind: 'excluded_reading', severity: 'info', runId: run.id, rangeId: range.id, readingId: r.id, dial: r.dial ?? undefined, message: `reading #${r.seq} of run ${run.id} excluded: ${r.excludedReason}` });
        }
      }
      if (run.standard) {
        standards.set(run.standard.id, run.standard);
        if (run.standard.dueDate < run.startedAt.toISOString().slice(0, 10)) {
          flags.push({ kind: 'standard_overdue', severity: 'warning', runId: run.id, rangeId: range.id, message: `standard ${run.standard.name} was past its due date (${run.standard.dueDate}) when run ${run.id} started` });
        }
      } else {
        flags.push({ kind: 'no_standard', severity: 'blocker', runId: run.id, rangeId: range.id, message: `run ${run.id} on ${range.label} names no reference standard: no uncertainty can be stated` });
      }
      if (run.standardOverrideReason) {
        flags.push({ kind: 'standard_override', severity: 'warning', runId: run.id, rangeId: range.id, message: `run ${run.id} used an overdue standard by override: ${run.standardOverrideReason}` });
      }
      let analysis: CalibrationAnalysis;
      try {
        analysis = analyseCalibration({
          law: range.dialLaw,
          tolerance: range.tolerance,
          readings: runReadings.map((r) => ({ dial: r.dial!, frequency: r.frequency, excluded: r.excludedReason !== null })),
        });
      } catch (error) {
        problems.push(`run ${run.id}: ${message(error)}`);
        flags.push({ kind: 'computation', severity: 'blocker', runId: run.id, rangeId: range.id, message: `run ${run.id} on ${range.label} cannot be analysed: ${message(error)}` });
        return null;
      }
      const samples = new Map<number, number[]>();
      for (const r of runReadings) {
        if (r.excludedReason !== null) continue;
        const key = r.dial === 0 ? 0 : r.dial!;
        samples.set(key, [...(samples.get(key) ?? []), ...(counterSamples.get(r.id) ?? [r.frequency])]);
      }
      const figures = effectiveFigures(procedure, run.overrides, span);
      const points = new Map<number, MeasuredPoint>();
      for (const p of analysis.points) {
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
          flags.push({ kind: 'outlier', severity: 'warning', runId: run.id, rangeId: range.id, dial: p.dial, message: `run ${run.id}, dial ${p.dial}: studentised residual ${p.studentised?.toFixed(1)} (above 3); check the reading` });
        }
        if (!run.standard) {
          measured.problem = 'no reference standard recorded for the run';
        } else {
          try {
            const budget = pointBudget({
              nominalHz: p.nominal,
              samples: samples.get(p.dial) ?? [p.measured],
              standard: run.standard,
              figures,
              slopeHzPerDialUnit: dialSlope(range.dialLaw, p.dial, span),
              dialUnit: range.dialUnit,
            });
            // ILAC-G8: w, the acceptance limit and the TUR take U as computed; the two-digit U is only printed.
            const decision = decide({ errorHz: p.errorHz, toleranceHz: tolHz, U: budget.Uunrounded, rule });
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
            flags.push({ kind: 'computation', severity: 'blocker', runId: run.id, rangeId: range.id, dial: p.dial, message: `run ${run.id}, dial ${p.dial}: ${message(error)}` });
          }
        }
        points.set(p.dial, measured);
      }
      return { run, analysis, points };
    };

    const found = analyse(asFoundRun);
    const left = analyse(asLeftRun);
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
        flags.push({ kind: 'tur_low', severity: 'warning', runId: final.runId, rangeId: range.id, dial, message: `${range.label}, dial ${dial}: test uncertainty ratio ${final.tur?.toFixed(2)}:1 is below 4:1` });
      }
      if (final?.decision && final.decision !== 'pass') {
        flags.push({ kind: 'point_not_conforming', severity: 'warning', runId: final.runId, rangeId: range.id, dial, message: `${range.label}, dial ${dial}: ${final.decision.replace('_', ' ')}${asLeft ? '' : ' (as found)'}` });
      }
      points.push({ dial, nominal, toleranceHz: toleranceHz(range.tolerance, nominal), asFound, asLeft });
    }
    const fitOf = (a: ReturnType<typeof analyse>) => (a ? { runId: a.run.id, fit: a.analysis.fit, tracking: a.analysis.tracking } : null);
    rangeResults.push({
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
    });
  }
  if (rangeResults.length === 0) {
    flags.push({ kind: 'no_calibration_run', severity: 'blocker', message: 'the job has no as-found or as-left run with readings' });
  }
  return {
    jobId: job.id,
    jobNumber: job.number,
    jobStatus: job.status,
    procedure: { id: procedure.id, name: procedure.name, method: procedure.method, decisionRule: procedure.decisionRule },
    decisionRule: rule,
    decisionRuleText: decisionRuleText(rule),
    ranges: rangeResults,
    standards: [...standards.values()],
    decision: worstDecision(rangeResults.map((r) => r.decision)),
    outcomes: jobOutcomes(rangeResults),
    flags,
  };
}
