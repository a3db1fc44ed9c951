/** Advance of one character of Roboto Mono, in em (600 of 1000 font units): every glyph, digits and signs alike. */
const MONO_ADVANCE_EM = 0.6;
/** Proportional text (the charts' default font): a digit is about 0.58 em; a grouping space narrower, but reckon it as a digit. */
const TEXT_ADVANCE_EM = 0.58;

/** Width in px of a line of text: monospaced at 0.6 em a character, else reckoned at 0.58 em. */
export function textWidth(text: string, fontSize: number, monospace = true): number {
  return Array.from(text).length * fontSize * (monospace ? MONO_ADVANCE_EM : TEXT_ADVANCE_EM);
}

/**
 * The round value a chart's "nice" domain can reach beyond an extreme: its first digit rounded away from
 * zero (−1 234 → −2 000, 87 → 90). Tick labels never hold more characters than this one's.
 */
export function niceExtreme(value: number): number {
  if (!Number.isFinite(value) || value === 0) return 0;
  const step = 10 ** Math.floor(Math.log10(Math.abs(value)));
  return Math.sign(value) * Math.ceil(Math.abs(value) / step - 1e-9) * step;
}

/**
 * Width a vertical axis needs so that no tick label is cut: the widest label that the data's extremes
 * (rounded as the chart rounds its domain) print as, plus the tick marks, a gap, and the rotated axis
 * title. Never less than `min`.
 */
export function yAxisWidth(
  values: readonly number[],
  format: (v: number) => string,
  options: { fontSize?: number; monospace?: boolean; title?: boolean; min?: number } = {},
): number {
  const { fontSize = 11, monospace = true, title = true, min = 48 } = options;
  const finite = values.filter((v) => Number.isFinite(v));
  if (finite.length === 0) return min;
  const candidates = [Math.min(...finite), Math.max(...finite)].flatMap((v) => [v, niceExtreme(v)]);
  const widest = Math.max(...candidates.map((v) => textWidth(format(v), fontSize, monospace)));
  // Tick mark 6 px, 6 px between it and the label, and the title's line (about 22 px) when there is one.
  return Math.max(min, Math.ceil(widest + 12 + (title ? 22 : 0)));
}
