import QRCode from 'qrcode';
import { formatFrequency, type FrequencyUnit } from '@kilocycle/common/units';
import { jobOutcomes, withOutcomes } from '@kilocycle/common/math';
import type { Decision, DecisionRule, JobOutcome, JobOutcomes, JobResults, MeasuredPoint, RangeResult, Tolerance } from '@kilocycle/common/types';
import {
  ACCENT,
  ALERT,
  CONTENT_WIDTH,
  drawPageFrames,
  fitText,
  FOUND,
  HEADER_FILL,
  houseDocument,
  INK,
  Layout,
  MARGIN,
  MUTED,
  PAGE,
  ROW_FILL,
  RULE,
  type Doc,
} from '../shared/pdf-house-style.js';
import { printableCertificateData } from './certificate-text.js';

/** Everything printed on a certificate; gathered once at signing. */
export type CertificatePdfData = {
  number: string;
  revision: number;
  replaces: { revision: number; reason: string; issuedAt: string | null } | null;
  lab: { name: string; address: string; place: string };
  customer: { name: string; contact: string | null };
  instrument: { make: string; model: string; serial: string; assetTag: string | null; description: string | null };
  job: {
    number: string;
    receivedDate: string;
    conditionReceived: string | null;
    ambientTempC: number | null;
    humidityPct: number | null;
    supplyVoltages: number[];
  };
  calibrationDates: { first: string; last: string };
  issuedAt: Date;
  results: JobResults;
  deviations: string[];
  signatory: { name: string; role: string; meaning: string; signedAt: Date };
  verifyUrl: string;
};

const DECISION_WORDS: Record<Decision, string> = {
  pass: 'pass',
  conditional_pass: 'cond. pass',
  conditional_fail: 'cond. fail',
  fail: 'fail',
};

const RULE_SHORT: Record<DecisionRule, string> = {
  simple: 'simple acceptance, no guard band (ILAC-G8:09/2019 4.2.1)',
  guarded_binary: 'guarded acceptance, guard band w = U (ILAC-G8:09/2019 4.2.2)',
  guarded: 'guarded acceptance with conditional pass and fail, guard band w = U (ILAC-G8:09/2019 4.2.3)',
};

/** The unit frequencies of a range are printed in: the dial's own unit, else the one that suits the span. */
export function displayUnit(range: Pick<RangeResult, 'dialUnit' | 'freqMaxHz'>): FrequencyUnit {
  if (range.dialUnit !== 'div') return range.dialUnit;
  return range.freqMaxHz >= 1e6 ? 'MHz' : range.freqMaxHz >= 1e3 ? 'kHz' : 'Hz';
}

const UNIT_DIGITS: Record<FrequencyUnit, number> = { Hz: 0, kHz: 3, MHz: 6 };

/** A frequency in a unit, with as many decimals as the Hz resolution `hzDecimals` needs (digit-grouped). */
export function frequencyText(hz: number, unit: FrequencyUnit, hzDecimals: number): string {
  const decimals = Math.min(12, Math.max(0, hzDecimals + UNIT_DIGITS[unit]));
  return formatFrequency(hz, unit, decimals).replace(/ [kMG]?Hz$/, '');
}

/** A signed value in Hz, digit-grouped: +12.3, -1 250.0. */
export function signedHz(value: number, decimals: number): string {
  const text = formatFrequency(value, 'Hz', Math.min(12, Math.max(0, decimals))).replace(/ Hz$/, '');
  return /^-/.test(text) || /^0(\.0*)?$/.test(text.replace(/ /g, '')) ? text : `+${text}`;
}

/** A frequency with no trailing zeros after the point: 1 750, 3 579.545. */
export function compactFrequency(hz: number, unit: FrequencyUnit): string {
  const text = frequencyText(hz, unit, 3);
  return text.includes('.') ? text.replace(/[ 0]+$/, '').replace(/\.$/, '') : text;
}

export function plainHz(value: number, decimals: number): string {
  return formatFrequency(value, 'Hz', Math.min(12, Math.max(0, decimals))).replace(/ Hz$/, '');
}

function dialText(dial: number, unit: string): string {
  const text = Number(dial.toPrecision(10)).toString();
  return unit === 'div' ? text : `${text}`;
}

function toleranceWords(tol: Tolerance): string {
  return tol.kind === 'percent' ? `±${tol.percent} % of setting` : `±(${tol.ppm} ppm of setting + ${tol.hz} Hz)`;
}

function decimalsOf(p: MeasuredPoint | null): number {
  return p?.budget ? p.decimals : 1;
}

function dateText(d: Date): string {
  return d.toISOString().slice(0, 10);
}

function timeText(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** Nice round tick values covering [min, max] (about `count` of them). */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!(max > min)) {
    const pad = Math.abs(min) > 0 ? Math.abs(min) * 0.1 : 1;
    return niceTicks(min - pad, max + pad, count);
  }
  const raw = (max - min) / count;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * magnitude).find((s) => s >= raw) ?? 10 * magnitude;
  const ticks: number[] = [];
  for (let v = Math.floor(min / step) * step; v <= max + step * 1e-9; v += step) ticks.push(Number(v.toPrecision(12)));
  if (ticks[0]! > min) ticks.unshift(Number((ticks[0]! - step).toPrecision(12)));
  if (ticks[ticks.length - 1]! < max) ticks.push(Number((ticks[ticks.length - 1]! + step).toPrecision(12)));
  return ticks;
}

type Column = { title: string; width: number; align: 'left' | 'right' | 'center'; group?: 'found' | 'left' };

/**
 * One range's results, per setting: nominal and tolerance, then as found (measured, error, U, k,
 * decision) and as left (the same), so results before and after adjustment stand side by side
 * (ISO/IEC 17025:2017 7.8.4.1).
 */
function resultsTable(layout: Layout, range: RangeResult, unit: FrequencyUnit): void {
  const doc = layout.doc;
  const columns = resultsColumns(range, unit);
  // A thin rule at the start of each side, from the header down to the segment's last row on this page.
  const groupStarts = (['found', 'left'] as const).map(
    (g) =>
      MARGIN.left +
      columns
        .slice(
          0,
          columns.findIndex((c) => c.group === g),
        )
        .reduce((w, c) => w + c.width, 0),
  );
  let segmentTop = 0;
  const closeSegment = () => {
    for (const gx of groupStarts)
      doc
        .moveTo(gx, segmentTop)
        .lineTo(gx, doc.y - 1.5)
        .lineWidth(0.5)
        .strokeColor(RULE)
        .stroke();
  };
  layout.ensure(RESULTS_HEADER_HEIGHT + RESULTS_ROW_HEIGHT * Math.min(4, range.points.length) + 4);
  drawResultsHeader(doc, columns);
  segmentTop = doc.y - 1.5;
  range.points.forEach((p, index) => {
    if (doc.y + RESULTS_ROW_HEIGHT > PAGE.height - MARGIN.bottom) {
      closeSegment();
      doc.addPage();
      doc.y = MARGIN.top;
      drawResultsHeader(doc, columns);
      segmentTop = doc.y - 1.5;
    }
    drawResultsRow(doc, range, unit, columns, p, index);
  });
  closeSegment();
  doc
    .moveTo(MARGIN.left, doc.y)
    .lineTo(MARGIN.left + CONTENT_WIDTH, doc.y)
    .lineWidth(0.4)
    .strokeColor(RULE)
    .stroke();
  doc.y += 4;
  doc.fillColor(INK);
}

const RESULTS_ROW_HEIGHT = 11.5;
const RESULTS_GROUP_HEIGHT = 10;
const RESULTS_HEADER_HEIGHT = RESULTS_GROUP_HEIGHT + 18;

/** Setting, nominal and tolerance, then five columns as found and five as left; the tolerance takes the width left over. */
function resultsColumns(range: RangeResult, unit: FrequencyUnit): Column[] {
  const side = (group: 'found' | 'left'): Column[] => [
    { title: `Measured (${unit})`, width: 53, align: 'right', group },
    { title: 'Error (Hz)', width: 41, align: 'right', group },
    { title: 'U (Hz)', width: 33, align: 'right', group },
    { title: 'k', width: 22, align: 'right', group },
    { title: 'Decision', width: 36, align: 'center', group },
  ];
  const fixed: Column[] = [
    { title: range.dialUnit === 'div' ? 'Setting (div)' : `Setting (${range.dialUnit})`, width: 36, align: 'right' },
    { title: `Nominal (${unit})`, width: 46, align: 'right' },
    { title: 'Tolerance ± (Hz)', width: 0, align: 'right' },
  ];
  const columns = [...fixed, ...side('found'), ...side('left')];
  fixed[2]!.width = CONTENT_WIDTH - columns.reduce((w, c) => w + c.width, 0);
  return columns;
}

/** The shaded header: the two side titles over their columns, then every column's title. */
function drawResultsHeader(doc: Doc, columns: readonly Column[]): void {
  const y = doc.y;
  doc.rect(MARGIN.left, y, CONTENT_WIDTH, RESULTS_HEADER_HEIGHT).fill(HEADER_FILL);
  let x = MARGIN.left;
  for (const group of ['found', 'left'] as const) {
    const start =
      MARGIN.left +
      columns
        .slice(
          0,
          columns.findIndex((c) => c.group === group),
        )
        .reduce((w, c) => w + c.width, 0);
    const width = columns.filter((c) => c.group === group).reduce((w, c) => w + c.width, 0);
    doc
      .font('bold')
      .fontSize(7)
      .fillColor(group === 'found' ? FOUND : ACCENT);
    doc.text(group === 'found' ? 'As found (before adjustment)' : 'As left (after adjustment)', start, y + 2.5, { width, align: 'center', lineBreak: false });
    doc
      .moveTo(start + 4, y + RESULTS_GROUP_HEIGHT + 0.5)
      .lineTo(start + width - 4, y + RESULTS_GROUP_HEIGHT + 0.5)
      .lineWidth(0.5)
      .strokeColor(group === 'found' ? FOUND : ACCENT)
      .stroke();
    doc
      .moveTo(start, y + 1)
      .lineTo(start, y + RESULTS_HEADER_HEIGHT - 1)
      .lineWidth(0.5)
      .strokeColor(RULE)
      .stroke();
  }
  doc.font('medium').fontSize(6.6).fillColor(MUTED);
  for (const c of columns) {
    const top = c.group ? y + RESULTS_GROUP_HEIGHT + 2.5 : y + 5;
    doc.text(c.title, x + 2.5, top, { width: c.width - 5, align: c.align, lineGap: 0 });
    x += c.width;
  }
  doc.y = y + RESULTS_HEADER_HEIGHT + 1.5;
}

/** A side's five cells: measured, error, U, k and decision (or one "not measured" note). */
function measuredCells(m: MeasuredPoint | null, unit: FrequencyUnit): string[] {
  if (!m) return ['not measured', '', '', '', ''];
  const d = decimalsOf(m);
  return [
    frequencyText(m.measured, unit, d),
    signedHz(m.budget ? m.errorRounded : m.errorHz, d),
    m.budget ? plainHz(m.budget.U, d) : '—',
    m.budget ? m.budget.k.toFixed(2) : '—',
    m.decision ? DECISION_WORDS[m.decision] : '—',
  ];
}

/** One setting's row, every other one shaded; a non-conforming decision in bold red, a conditional pass in amber. */
function drawResultsRow(doc: Doc, range: RangeResult, unit: FrequencyUnit, columns: readonly Column[], p: RangeResult['points'][number], index: number): void {
  const decimals = decimalsOf(p.asLeft ?? p.asFound);
  const y = doc.y;
  if (index % 2 === 1) doc.rect(MARGIN.left, y - 1.5, CONTENT_WIDTH, RESULTS_ROW_HEIGHT).fill(ROW_FILL);
  const cells = [
    dialText(p.dial, range.dialUnit),
    frequencyText(p.nominal, unit, decimals),
    plainHz(p.toleranceHz, Math.max(0, decimals)),
    ...measuredCells(p.asFound, unit),
    ...measuredCells(p.asLeft, unit),
  ];
  const decisionOf = (i: number) => (i === 7 ? p.asFound?.decision : i === 12 ? p.asLeft?.decision : undefined);
  let x = MARGIN.left;
  cells.forEach((cell, i) => {
    const c = columns[i]!;
    const decision = decisionOf(i);
    const isDecision = i === 7 || i === 12;
    const bad = isDecision && (decision === 'fail' || decision === 'conditional_fail');
    const conditional = isDecision && decision === 'conditional_pass';
    if (cell === 'not measured') {
      // One muted note across the side's five cells.
      const width = columns.filter((col) => col.group === c.group).reduce((w, col) => w + col.width, 0);
      const note = c.group === 'left' && range.asLeftRunId === null ? 'not adjusted: the as-found result is final' : 'not measured';
      doc
        .font('sans')
        .fontSize(7)
        .fillColor(MUTED)
        .text(note, x + 3, y, { width: width - 6, align: 'center', lineBreak: false });
    } else if (cell !== '') {
      doc.font(isDecision ? (bad ? 'bold' : conditional ? 'medium' : 'sans') : 'mono').fillColor(bad ? ALERT : conditional ? FOUND : INK);
      fitText(doc, cell, x + 2.5, y, c.width - 5, c.align, 7.2);
    }
    x += c.width;
  });
  doc.y = y + RESULTS_ROW_HEIGHT;
}

function fitSentence(label: string, summary: RangeResult['asLeftFit']): string | null {
  if (!summary) return null;
  if (!summary.fit || !summary.tracking) return `${label} (run ${summary.runId}): fewer than three settings, no line fitted.`;
  const f = summary.fit;
  const ppm = f.slope * 1e6;
  return (
    `${label} (run ${summary.runId}): error ≈ ${signedHz(f.offsetHz, 1)} Hz ${ppm >= 0 ? '+' : '−'} ${Math.abs(ppm).toFixed(2)} ppm × nominal ` +
    `(scale error ${ppm >= 0 ? '+' : '−'}${Math.abs(ppm).toFixed(2)} ± ${(f.seSlope * 1e6).toFixed(2)} ppm; residual SD ${plainHz(f.residualSd, 1)} Hz; R² ${f.r2.toFixed(4)}). ` +
    `Tracking error: max ${plainHz(f ? summary.tracking.bestFit.maxAbsHz : 0, 1)} Hz, RMS ${plainHz(summary.tracking.bestFit.rmsHz, 1)} Hz from the best-fit line; ` +
    `max ${plainHz(summary.tracking.endPoint.maxAbsHz, 1)} Hz, RMS ${plainHz(summary.tracking.endPoint.rmsHz, 1)} Hz from the end-point line.`
  );
}

/** Error against setting, drawn as vectors: tolerance limits, zero line, as-found and as-left points with U bars. */
function errorPlot(layout: Layout, range: RangeResult, unit: FrequencyUnit): void {
  const doc = layout.doc;
  const height = 142;
  layout.ensure(height + 30);
  const box = { x: MARGIN.left + 44, y: doc.y + 14, w: CONTENT_WIDTH - 44 - 8, h: height - 26 };
  const points = range.points;
  if (points.length === 0) return;
  const scale = plotScale(points, unit, box);
  doc.save();
  drawPlotAxes(doc, box, scale, unit);
  drawPlotData(doc, box, points, scale);
  drawPlotLegend(doc, box, range);
  doc.restore();
  doc.x = MARGIN.left;
  doc.y = box.y + box.h + 22;
  doc.fillColor(INK);
}

type PlotBox = { x: number; y: number; w: number; h: number };
type PlotScale = { mult: number; xTicks: number[]; yTicks: number[]; yLo: number; yHi: number; px: (v: number) => number; py: (v: number) => number };

/** The axes' ranges and ticks: nominal (in the display unit) with a little room at both ends, error over the tolerances and every U bar. */
function plotScale(points: RangeResult['points'], unit: FrequencyUnit, box: PlotBox): PlotScale {
  const mult = 10 ** UNIT_DIGITS[unit];
  const xs = points.map((p) => p.nominal / mult);
  let xMin = Math.min(...xs);
  let xMax = Math.max(...xs);
  if (xMax === xMin) {
    xMin -= 1;
    xMax += 1;
  }
  // A little room at both ends, so the end points and their bars clear the frame and the tick labels.
  const pad = (xMax - xMin) * 0.025;
  const [dataMin, dataMax] = [xMin, xMax];
  xMin -= pad;
  xMax += pad;
  const ys: number[] = [];
  for (const p of points) {
    ys.push(p.toleranceHz, -p.toleranceHz);
    for (const m of [p.asFound, p.asLeft]) if (m) ys.push(m.errorHz + (m.budget?.U ?? 0), m.errorHz - (m.budget?.U ?? 0));
  }
  const yTicks = niceTicks(Math.min(...ys), Math.max(...ys), 4);
  const xTicks = niceTicks(dataMin, dataMax, 6).filter((t) => t >= xMin && t <= xMax);
  const yLo = yTicks[0]!;
  const yHi = yTicks[yTicks.length - 1]!;
  const px = (v: number) => box.x + ((v - xMin) / (xMax - xMin)) * box.w;
  const py = (v: number) => box.y + box.h - ((v - yLo) / (yHi - yLo)) * box.h;
  return { mult, xTicks, yTicks, yLo, yHi, px, py };
}

/** The frame, grid lines, tick labels and axis titles. */
function drawPlotAxes(doc: Doc, box: PlotBox, scale: PlotScale, unit: FrequencyUnit): void {
  const { mult, xTicks, yTicks, px, py } = scale;
  doc.rect(box.x, box.y, box.w, box.h).lineWidth(0.5).strokeColor(RULE).stroke();
  doc.font('mono').fontSize(6).fillColor(MUTED);
  for (const t of yTicks) {
    doc
      .moveTo(box.x, py(t))
      .lineTo(box.x + box.w, py(t))
      .lineWidth(0.25)
      .strokeColor('#e4e7eb')
      .stroke();
    doc.text(plainHz(t, Math.max(0, -Math.floor(Math.log10(Math.abs(yTicks[1]! - yTicks[0]!))))), box.x - 42, py(t) - 2.5, {
      width: 38,
      align: 'right',
      lineBreak: false,
    });
  }
  for (const t of xTicks) {
    doc
      .moveTo(px(t), box.y + box.h)
      .lineTo(px(t), box.y + box.h + 2.5)
      .lineWidth(0.4)
      .strokeColor(MUTED)
      .stroke();
    const step = xTicks.length > 1 ? Math.abs(xTicks[1]! - xTicks[0]!) : 1;
    const decimals = Math.max(0, -Math.floor(Math.log10(step)));
    doc.text(formatFrequency(t * mult, unit, Math.min(12, decimals)).replace(/ [kMG]?Hz$/, ''), px(t) - 30, box.y + box.h + 4, {
      width: 60,
      align: 'center',
      lineBreak: false,
    });
  }
  doc.font('sans').fontSize(6.5).fillColor(MUTED);
  doc.text(`nominal (${unit})`, box.x + box.w - 80, box.y + box.h + 12, { width: 80, align: 'right', lineBreak: false });
  doc.save();
  doc.rotate(-90, { origin: [MARGIN.left + 4, box.y + box.h / 2] });
  doc.text('error (Hz)', MARGIN.left + 4 - 30, box.y + box.h / 2 - 3, { width: 60, align: 'center', lineBreak: false });
  doc.restore();
}

/** The zero line, the tolerance limits and the as-found and as-left points with their U bars. */
function drawPlotData(doc: Doc, box: PlotBox, points: RangeResult['points'], scale: PlotScale): void {
  const { mult, yLo, yHi, px, py } = scale;
  // zero line and tolerance limits (follow the nominal: the band widens with a percent tolerance)
  if (yLo < 0 && yHi > 0)
    doc
      .moveTo(box.x, py(0))
      .lineTo(box.x + box.w, py(0))
      .lineWidth(0.6)
      .strokeColor(MUTED)
      .stroke();
  for (const sign of [1, -1]) {
    points.forEach((p, i) => {
      const x = px(p.nominal / mult);
      const y = py(sign * p.toleranceHz);
      if (i === 0) doc.moveTo(x, y);
      else doc.lineTo(x, y);
    });
    doc.lineWidth(0.8).dash(3, { space: 2 }).strokeColor(ALERT).stroke();
    doc.undash();
  }
  const series: Array<{ pick: (p: RangeResult['points'][number]) => MeasuredPoint | null; color: string; filled: boolean; offset: number }> = [
    { pick: (p) => p.asFound, color: FOUND, filled: false, offset: -2 },
    { pick: (p) => p.asLeft, color: ACCENT, filled: true, offset: 2 },
  ];
  for (const s of series) {
    for (const p of points) {
      const m = s.pick(p);
      if (!m) continue;
      const x = px(p.nominal / mult) + s.offset;
      const y = py(m.errorHz);
      if (m.budget) {
        const top = py(m.errorHz + m.budget.U);
        const bottom = py(m.errorHz - m.budget.U);
        doc
          .moveTo(x, top)
          .lineTo(x, bottom)
          .moveTo(x - 1.8, top)
          .lineTo(x + 1.8, top)
          .moveTo(x - 1.8, bottom)
          .lineTo(x + 1.8, bottom);
        doc.lineWidth(0.5).strokeColor(s.color).stroke();
      }
      doc.circle(x, y, 1.9).lineWidth(0.7);
      if (s.filled) doc.fillAndStroke(s.color, s.color);
      else doc.fillAndStroke('#ffffff', s.color);
    }
  }
}

/** The caption naming the range and the legend, above the plot's top right corner (never over the data). */
function drawPlotLegend(doc: Doc, box: PlotBox, range: RangeResult): void {
  // legend, above the plot's top right corner (never over the data)
  const ly = box.y - 9;
  doc.font('sans').fontSize(6.2);
  const legend: Array<[string, (x: number) => void]> = [
    [
      'as found ± U',
      (x) =>
        doc
          .circle(x + 3, ly + 2.5, 1.9)
          .lineWidth(0.7)
          .fillAndStroke('#ffffff', FOUND),
    ],
    [
      'as left ± U',
      (x) =>
        doc
          .circle(x + 3, ly + 2.5, 1.9)
          .lineWidth(0.7)
          .fillAndStroke(ACCENT, ACCENT),
    ],
    [
      'tolerance limits',
      (x) => {
        doc
          .moveTo(x, ly + 2.5)
          .lineTo(x + 9, ly + 2.5)
          .lineWidth(0.8)
          .dash(3, { space: 2 })
          .strokeColor(ALERT)
          .stroke();
        doc.undash();
      },
    ],
  ];
  const legendWidth = legend.reduce((w, [label]) => w + 12 + doc.widthOfString(label) + 12, 0);
  // A caption names the range, so a plot that falls to the next page is still read against its table.
  doc.font('medium').fontSize(6.5).fillColor(MUTED);
  doc.text(`Range ${range.position}, ${range.label}: error against nominal`, box.x, ly, {
    width: box.w - legendWidth - 8,
    height: 8,
    lineBreak: false,
    ellipsis: true,
  });
  doc.font('sans').fontSize(6.2);
  let lx = box.x + box.w - legendWidth + 12;
  for (const [label, mark] of legend) {
    mark(lx);
    doc.fillColor(MUTED).text(label, lx + 12, ly, { lineBreak: false });
    lx += 12 + doc.widthOfString(label) + 12;
  }
}

function settingText(range: RangeResult, dial: number): string {
  return `${dialText(dial, range.dialUnit)}${range.dialUnit === 'div' ? ' div' : ` ${range.dialUnit}`}`;
}

function conformityStatement(results: JobResults, outcomes: JobOutcomes): string {
  const lines: string[] = [];
  const rangesWithDecisions = results.ranges.filter((r) => r.decision !== null);
  if (rangesWithDecisions.length === 0) return 'No statement of conformity is made: no point could be decided.';
  const nonConforming: string[] = [];
  for (const r of results.ranges) {
    for (const p of r.points) {
      const final = p.asLeft ?? p.asFound;
      if (final?.decision && final.decision !== 'pass') nonConforming.push(`${r.label} at ${settingText(r, p.dial)} (${final.decision.replace('_', ' ')})`);
    }
  }
  const basis = results.ranges.some((r) => r.asLeftRunId !== null) ? 'as-left' : 'as-found';
  if (nonConforming.length === 0) {
    lines.push(`Every ${basis} result conforms to the tolerance stated for its range under the decision rule above.`);
  } else {
    lines.push(`The ${basis} results conform to the tolerance stated for their ranges under the decision rule above, except: ${nonConforming.join('; ')}.`);
  }
  if (outcomes.asLeft && outcomes.asFound && outcomes.asFound.outOfTolerance > 0) {
    const found: string[] = [];
    for (const r of results.ranges) {
      const out = r.points.filter((p) => p.asFound?.decision === 'fail' || p.asFound?.decision === 'conditional_fail');
      // One unit per range; a conditional fail (beyond the limit by less than U) is marked.
      const dials = out.map((p) => `${dialText(p.dial, r.dialUnit)}${p.asFound!.decision === 'conditional_fail' ? ' (conditional fail)' : ''}`);
      if (out.length > 0) found.push(`${r.label} at ${dials.join(', ')} ${r.dialUnit}`);
    }
    lines.push(
      `As found, before adjustment, the instrument was out of tolerance at ${outcomes.asFound.outOfTolerance} of ${outcomes.asFound.settings} settings: ${found.join('; ')}.`,
    );
  }
  return lines.join(' ');
}

/** The settings whose test uncertainty ratio is below 4:1, as found and as left, listed with the ratio. */
function lowTurSentence(results: JobResults): string {
  const entries: string[] = [];
  let count = 0;
  for (const r of results.ranges) {
    const here: string[] = [];
    for (const p of r.points) {
      const sides = (
        [
          ['as found', p.asFound],
          ['as left', p.asLeft],
        ] as const
      ).filter(([, m]) => m?.turFlag && m.tur !== null);
      if (sides.length === 0) continue;
      count += 1;
      here.push(`${settingText(r, p.dial)} (${sides.map(([label, m]) => `${m!.tur!.toFixed(1)}:1 ${label}`).join(', ')})`);
    }
    if (here.length > 0) entries.push(`range ${r.position}, ${r.label}: ${here.join('; ')}`);
  }
  const what = 'The test uncertainty ratio (TUR = tolerance ÷ U) shows how much of the tolerance the uncertainty takes; below 4:1 it is marked.';
  if (count === 0) return `${what} It is 4:1 or more at every setting reported.`;
  return `${what} It is below 4:1 at ${count} setting${count === 1 ? '' : 's'} — ${entries.join(' — ')}.`;
}

const OUTCOME_COLORS = { bad: ALERT, conditional: '#9a6b1f', good: '#1d6b3a', none: MUTED };

function outcomeTone(o: JobOutcome | null): keyof typeof OUTCOME_COLORS {
  if (!o || o.decision === null) return 'none';
  if (o.outOfTolerance > 0) return 'bad';
  return o.conditional > 0 ? 'conditional' : 'good';
}

function capitalised(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Page 1: both outcomes, plainly, in a box near the top (an as-found failure is never left for page 2). */
function outcomeBox(layout: Layout, outcomes: JobOutcomes, rule: string): void {
  const doc = layout.doc;
  const rows: Array<[string, string, keyof typeof OUTCOME_COLORS]> = [
    ['As found (before adjustment)', outcomes.asFound ? capitalised(outcomes.asFound.words) : 'Not measured', outcomeTone(outcomes.asFound)],
    [
      'As left (after adjustment)',
      outcomes.asLeft ? capitalised(outcomes.asLeft.words) : 'No adjustment was recorded: the as-found results are the final ones',
      outcomes.asLeft ? outcomeTone(outcomes.asLeft) : 'none',
    ],
  ];
  const labelWidth = 130;
  const textWidth = CONTENT_WIDTH - labelWidth - 16;
  doc.font('bold').fontSize(9);
  const heights = rows.map(([, text]) => Math.max(doc.heightOfString(text, { width: textWidth }), 11));
  const notes: string[] = [];
  if (outcomes.asLeft && outcomes.asFoundFinalRanges.length > 0)
    notes.push(`Not adjusted, so the as-found results are final: ${outcomes.asFoundFinalRanges.join('; ')}.`);
  notes.push(`Decision rule: ${rule}. Per-setting results, uncertainties and decisions follow.`);
  doc.font('sans').fontSize(7.5);
  const noteHeight = doc.heightOfString(notes.join(' '), { width: CONTENT_WIDTH - 16 });
  const height = 20 + heights.reduce((a, b) => a + b + 4, 0) + noteHeight + 8;
  layout.ensure(height + 12);
  doc.moveDown(0.6);
  const top = doc.y;
  doc.rect(MARGIN.left, top, CONTENT_WIDTH, height).lineWidth(0.8).fillAndStroke('#f5f7f9', ACCENT);
  doc
    .font('bold')
    .fontSize(10.5)
    .fillColor(ACCENT)
    .text('Result', MARGIN.left + 8, top + 6, { width: CONTENT_WIDTH - 16 });
  let y = top + 22;
  rows.forEach(([label, text, tone], i) => {
    doc
      .font('sans')
      .fontSize(7.5)
      .fillColor(MUTED)
      .text(label, MARGIN.left + 8, y + 1.2, { width: labelWidth - 6 });
    doc
      .font('bold')
      .fontSize(9)
      .fillColor(OUTCOME_COLORS[tone])
      .text(text, MARGIN.left + 8 + labelWidth, y, { width: textWidth });
    y += heights[i]! + 4;
  });
  doc
    .font('sans')
    .fontSize(7.5)
    .fillColor(INK)
    .text(notes.join(' '), MARGIN.left + 8, y + 1, { width: CONTENT_WIDTH - 16 });
  doc.y = top + height + 2;
  doc.x = MARGIN.left;
  doc.fillColor(INK);
}

/** Draws the certificate. Pages are buffered so every page can carry "Page x of y" at the end. */
export async function renderCertificatePdf(input: CertificatePdfData): Promise<Buffer> {
  // Control characters go everywhere; names, serials and labels print on one line (see certificate-text.ts).
  const data = printableCertificateData(input);
  const qr = await QRCode.toBuffer(data.verifyUrl, { type: 'png', errorCorrectionLevel: 'M', margin: 1, width: 240 });
  const { doc, finished } = houseDocument({
    Title: `Calibration certificate ${data.number} revision ${data.revision}`,
    Author: data.lab.name,
    Subject: `${data.instrument.make} ${data.instrument.model}, serial ${data.instrument.serial}`,
    CreationDate: data.issuedAt,
  });
  const layout = new Layout(doc);
  // Results stored before the two outcomes were kept get them from their own points.
  const r = withOutcomes(data.results);

  titleBlock(layout, data, r, qr);
  identitySections(layout, data, r);
  traceabilitySection(layout, r);
  for (const range of r.ranges) rangeSection(layout, range);
  statementSections(layout, data, r);
  pageFrames(doc, data);
  doc.end();
  return finished;
}

/** The title, number and revision, the QR code to the verification page, and the outcome box. */
function titleBlock(layout: Layout, data: CertificatePdfData, r: JobResults & { outcomes: JobOutcomes }, qr: Buffer): void {
  const doc = layout.doc;
  const qrSize = 78;
  doc.image(qr, PAGE.width - MARGIN.right - qrSize, MARGIN.top - 4, { width: qrSize });
  doc
    .font('sans')
    .fontSize(6)
    .fillColor(MUTED)
    .text('Scan to check this certificate', PAGE.width - MARGIN.right - qrSize - 10, MARGIN.top + qrSize - 2, { width: qrSize + 10, align: 'center' });
  doc
    .font('bold')
    .fontSize(20)
    .fillColor(INK)
    .text('Calibration Certificate', MARGIN.left, MARGIN.top, { width: CONTENT_WIDTH - qrSize - 12 });
  doc
    .font('mono')
    .fontSize(10)
    .fillColor(ACCENT)
    .text(`${data.number}  ·  revision ${data.revision}`, MARGIN.left, doc.y + 2);
  doc
    .font('sans')
    .fontSize(8.5)
    .fillColor(MUTED)
    .text(`Issued ${dateText(data.issuedAt)} by ${data.lab.name}`, MARGIN.left, doc.y + 2);
  if (data.replaces) {
    doc
      .font('bold')
      .fontSize(8.5)
      .fillColor(ALERT)
      .text(
        `This revision replaces revision ${data.replaces.revision}${data.replaces.issuedAt ? ` (issued ${data.replaces.issuedAt.slice(0, 10)})` : ''}.`,
        MARGIN.left,
        doc.y + 2,
        { width: CONTENT_WIDTH - qrSize - 12 },
      );
  }
  doc.y = Math.max(doc.y, MARGIN.top + qrSize + 10);
  doc.fillColor(INK);
  outcomeBox(layout, r.outcomes, RULE_SHORT[r.decisionRule]);
}

/** Laboratory and customer, the item calibrated, and the dates, method and conditions. */
function identitySections(layout: Layout, data: CertificatePdfData, r: JobResults): void {
  layout.heading('Laboratory and customer', 90);
  layout.fields([
    ['Laboratory', `${data.lab.name}\n${data.lab.address}`],
    ['Place of calibration', data.lab.place],
    ['Customer', data.customer.name],
    ['Customer contact', data.customer.contact ?? ''],
  ]);

  layout.heading('Item calibrated', 90);
  layout.fields([
    ['Make and model', `${data.instrument.make} ${data.instrument.model}`],
    ['Serial number', data.instrument.serial],
    ['Asset tag', data.instrument.assetTag ?? 'none given'],
    ...(data.instrument.description ? ([['Description', data.instrument.description]] as Array<[string, string]>) : []),
    ['Condition as received', data.job.conditionReceived ?? 'not recorded'],
    ['Ranges calibrated', r.ranges.map((g) => `${g.position}. ${g.label}`).join('; ')],
  ]);

  layout.heading('Dates, method and conditions', 90);
  const env: string[] = [];
  if (data.job.ambientTempC !== null) env.push(`ambient temperature ${data.job.ambientTempC.toFixed(1)} °C`);
  if (data.job.humidityPct !== null) env.push(`relative humidity ${data.job.humidityPct.toFixed(0)} %`);
  if (data.job.supplyVoltages.length > 0) env.push(`supply voltage ${[...new Set(data.job.supplyVoltages)].map((v) => `${v} V`).join(', ')}`);
  layout.fields([
    ['Job', data.job.number],
    ['Received', data.job.receivedDate],
    [
      'Calibrated',
      data.calibrationDates.first === data.calibrationDates.last
        ? data.calibrationDates.first
        : `${data.calibrationDates.first} to ${data.calibrationDates.last}`,
    ],
    ['Issued', dateText(data.issuedAt)],
    ['Procedure', r.procedure.name],
    ['Method', r.procedure.method],
    ['Environment', env.length > 0 ? env.join('; ') : 'not recorded'],
  ]);
}

/** The standards the results are traceable through. */
function traceabilitySection(layout: Layout, r: JobResults): void {
  layout.heading('Metrological traceability', 70);
  if (r.standards.length === 0) layout.paragraph('No reference standard is recorded for the runs reported.');
  for (const s of r.standards) {
    layout.paragraph(
      `${s.name}: ${s.makeModel}, serial ${s.serial}; calibration certificate ${s.certificateNumber}, due ${s.dueDate}. ` +
        `Time-base accuracy ±${s.timebaseAccuracyPpm} ppm, resolution ${s.resolutionHz} Hz, calibration uncertainty ${s.calibrationUPpm} ppm (k = ${s.calibrationK}).`,
    );
  }
  layout.paragraph(
    'The frequencies reported are traceable to the SI unit of time through the calibration of the standard named above, ' +
      'which the laboratory keeps within its due date.',
    8,
  );
}

/** One range: its span and tolerance, the results table, the fitted lines and the error plot. */
function rangeSection(layout: Layout, range: RangeResult): void {
  const unit = displayUnit(range);
  layout.heading(`Results, range ${range.position}: ${range.label}`, 200);
  const span = `${compactFrequency(range.freqMinHz, unit)} to ${compactFrequency(range.freqMaxHz, unit)} ${unit}`;
  const runs = [range.asFoundRunId ? `as found: run ${range.asFoundRunId}` : null, range.asLeftRunId ? `as left: run ${range.asLeftRunId}` : null]
    .filter(Boolean)
    .join(', ');
  layout.paragraph(
    `Span ${span}; tolerance ${toleranceWords(range.tolerance)}; ${runs}. Each row is the mean of the readings at that setting; ` +
      'error = measured − nominal; U is the expanded uncertainty with its coverage factor k (coverage probability ≈ 95 %).',
    7.8,
  );
  layout.paragraph(`This range: ${jobOutcomes([range]).summary}`, 7.8, 'medium');
  resultsTable(layout, range, unit);
  for (const sentence of [fitSentence('As-found fit', range.asFoundFit), fitSentence('As-left fit', range.asLeftFit)]) {
    if (sentence) layout.paragraph(sentence, 7.6);
  }
  if (range.problems.length > 0) layout.paragraph(`Not evaluated: ${range.problems.join('; ')}`, 7.6);
  errorPlot(layout, range, unit);
}

/** Uncertainty, the decision rule and conformity, remarks, an amendment, and the authorisation. */
function statementSections(layout: Layout, data: CertificatePdfData, r: JobResults & { outcomes: JobOutcomes }): void {
  const doc = layout.doc;
  // ---- Statements ----
  layout.heading('Measurement uncertainty', 80);
  const extra = new Set<string>();
  for (const range of r.ranges) for (const p of range.points) for (const m of [p.asFound, p.asLeft]) for (const l of m?.budget?.lines ?? []) extra.add(l.name);
  layout.paragraph(
    'The expanded uncertainty U is the combined standard uncertainty multiplied by the coverage factor k, evaluated following ' +
      'JCGM 100:2008 (GUM). k is the Student t value for the effective degrees of freedom (Welch–Satterthwaite), so that the interval ' +
      '±U has a coverage probability of approximately 95 %; k = 2 when the degrees of freedom are large. U is given to two significant ' +
      'digits and the results to the same decimal place. Contributions considered at each setting: ' +
      `${[...extra].join('; ')}.`,
  );

  layout.heading('Decision rule and statement of conformity', 80);
  layout.paragraph(r.decisionRuleText);
  layout.paragraph(conformityStatement(r, r.outcomes));
  layout.paragraph(lowTurSentence(r), 7.8);

  layout.heading('Remarks and deviations from the method', 50);
  const remarks = [...data.deviations];
  if (remarks.length === 0) remarks.push('None.');
  for (const remark of remarks) layout.paragraph(`• ${remark}`, 8);
  layout.paragraph(
    'The results relate only to the item calibrated, as received and at the settings stated. This certificate does not recommend a ' +
      'calibration interval. It may be reproduced only in full, unless the laboratory agrees otherwise in writing.',
    8,
  );

  if (data.replaces) {
    layout.heading('Amendment', 50);
    layout.paragraph(
      `This is revision ${data.revision}; it replaces revision ${data.replaces.revision}, which is withdrawn from use. Reason: ${data.replaces.reason}`,
    );
  }

  layout.heading('Authorisation', 90);
  layout.fields([
    ['Authorised by', `${data.signatory.name}, ${data.signatory.role}`],
    ['Signed', `${timeText(data.signatory.signedAt)}, meaning: “${data.signatory.meaning}”`],
    ['Electronic seal', 'The laboratory server records the SHA-256 digest of this file and seals it with its Ed25519 key. The verification page checks both.'],
    ['Verify at', data.verifyUrl],
  ]);
  doc.moveDown(0.8);
  layout.ensure(20);
  doc
    .font('medium')
    .fontSize(8)
    .fillColor(MUTED)
    .text(`— End of certificate ${data.number}, revision ${data.revision} —`, MARGIN.left, doc.y, { width: CONTENT_WIDTH, align: 'center' });
}

/** The header and footer on every page, in the house frame. */
function pageFrames(doc: Doc, data: CertificatePdfData): void {
  drawPageFrames(doc, {
    labName: data.lab.name,
    subtitle: 'Frequency calibration',
    reference: `Certificate ${data.number} · rev. ${data.revision}`,
    footer: `Results relate only to the item calibrated. Reproduce only in full. Check this copy at ${data.verifyUrl}`,
    footerReference: (page, count) => `${data.number}/${data.revision} · ${page}/${count}`,
  });
}
