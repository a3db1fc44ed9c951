import { roundResultToUncertainty } from '@kilocycle/common/math';
import type { DecisionRule, DialUnit, FrequencyUnit, MeasuredPoint, RangeResult, RunKind, Tolerance } from '@kilocycle/common/types';
import { bestUnit, formatNumber } from '@/utils/frequency';

export const RUN_KIND_LABELS: Record<RunKind, string> = {
  as_found: 'As found',
  as_left: 'As left',
  warmup: 'Warm-up',
  stability: 'Stability',
  supply_sensitivity: 'Supply sensitivity',
  keying: 'Keying',
};

export const DECISION_RULE_LABELS: Record<DecisionRule, string> = {
  simple: 'Simple acceptance (w = 0)',
  guarded_binary: 'Guarded acceptance, pass or fail (w = U)',
  guarded: 'Guarded acceptance with conditional results (w = U)',
};

/** The unit a range's frequencies read best in: its dial's unit, or by size for a dial in divisions. */
export function rangeUnit(range: Pick<RangeResult, 'dialUnit' | 'freqMaxHz'>): FrequencyUnit {
  return range.dialUnit === 'div' ? bestUnit(range.freqMaxHz) : range.dialUnit;
}

export function toleranceText(tolerance: Tolerance): string {
  if (tolerance.kind === 'percent') return `±${tolerance.percent} % of setting`;
  return tolerance.hz ? `±(${tolerance.ppm} ppm + ${tolerance.hz} Hz)` : `±${tolerance.ppm} ppm`;
}

/** The decimals a dial setting is written with, from the setting itself (1750 → 0, 3.55 → 2). */
function dialDecimals(value: number): number {
  const text = String(value);
  const dot = text.indexOf('.');
  return dot < 0 || text.includes('e') ? 0 : Math.min(6, text.length - dot - 1);
}

export function formatDial(dial: number, unit: DialUnit): string {
  return `${formatNumber(dial, dialDecimals(dial))} ${unit === 'div' ? 'div' : unit}`;
}

/** The error as rounded to the last digit of U (GUM 7.2.6). */
export function formatError(point: Pick<MeasuredPoint, 'errorRounded' | 'decimals'>): string {
  return `${formatNumber(point.errorRounded, Math.max(0, point.decimals))} Hz`;
}

/** Expanded uncertainty in Hz, rounded to two significant digits by common's rule (GUM 7.2.6). */
export function formatUncertainty(u: number): string {
  if (!Number.isFinite(u) || u <= 0) return formatNumber(u, 0);
  const { uncertainty, decimals } = roundResultToUncertainty(0, u);
  return `${formatNumber(uncertainty, Math.max(0, decimals))} Hz`;
}

export function formatTur(tur: number | null): string {
  if (tur === null || !Number.isFinite(tur)) return '—';
  return `${tur >= 10 ? tur.toFixed(0) : tur.toFixed(1)}:1`;
}
