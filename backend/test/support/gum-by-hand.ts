// An uncertainty budget and a conformity decision worked by hand, from the published formulas, for tests to
// compare the server's numbers with. Nothing here calls the product's math: JCGM 100:2008 (GUM) 4.2.3, 4.3.7,
// 5.1.2, G.4.1 (Welch–Satterthwaite, Eq. G.2b), G.3 and Table G.2 (k from Student's t, here jstat's quantile);
// ILAC-G8:09/2019 4.2 for the decision (fixtures/conformity/ilac_g8_decision_rules.md).
import jstat from 'jstat';

/** "95.45 %" of GUM Table G.2: the probability of ±2σ of a normal distribution, from jstat's normal CDF. */
export const P_95_45 = 2 * jstat.normal.cdf(2, 0, 1) - 1;

export type ByHandPoint = {
  nominalHz: number;
  /** The included counter readings at the setting, Hz. */
  samples: number[];
  /** The standard: time-base accuracy ±ppm, counter resolution Hz (±1 count), its certificate's U in ppm and k. */
  timebasePpm: number;
  resolutionHz: number;
  calibrationUPpm: number;
  calibrationK: number;
  /** Half a dial division in dial units, and the dial law's local slope in Hz per dial unit. */
  dialHalfDivision: number;
  slopeHzPerDial: number;
  /** Drift allowance ±(ppm of the nominal + Hz), rectangular. */
  driftPpm: number;
  driftHz: number;
  /** A procedure's extra lines. */
  extras: Array<{
    value: number;
    unit: 'Hz' | 'ppm';
    distribution: 'normal' | 'rectangular' | 'triangular' | 'u_shaped';
    divisor?: number;
    dof?: number | null;
  }>;
};

export type ByHandBudget = { mean: number; n: number; uc: number; nuEff: number; k: number; Uunrounded: number; U: number };

/** Two significant digits, half away from zero, on the decimal value (GUM 7.2.6). */
export function twoSignificant(x: number): number {
  const exponent = Math.floor(Math.log10(x)) - 1;
  const scaled = Number((x / 10 ** exponent).toPrecision(12));
  return Number((Math.round(scaled) * 10 ** exponent).toPrecision(2));
}

export function budgetByHand(p: ByHandPoint): ByHandBudget {
  const n = p.samples.length;
  const mean = p.samples.reduce((a, b) => a + b, 0) / n;
  const f = p.nominalHz;
  const sqrt3 = Math.sqrt(3);
  // [u_i in Hz, ν_i] with ν = Infinity for Type B.
  const lines: Array<[number, number]> = [
    [(p.timebasePpm * 1e-6 * f) / sqrt3, Infinity], // time base, ±a·f rectangular (GUM 4.3.7)
    [p.resolutionHz / sqrt3, Infinity], // ±1 count, rectangular
    [(p.dialHalfDivision * Math.abs(p.slopeHzPerDial)) / sqrt3, Infinity], // half a division × df/d(dial), rectangular
    [(p.driftPpm * 1e-6 * f + p.driftHz) / sqrt3, Infinity], // drift, rectangular
    [(p.calibrationUPpm * 1e-6 * f) / p.calibrationK, Infinity], // the standard's certificate, U/k
  ];
  if (n >= 2) {
    const s = Math.sqrt(p.samples.reduce((a, b) => a + (b - mean) ** 2, 0) / (n - 1));
    lines.push([s / Math.sqrt(n), n - 1]); // repeatability, Type A, s/√n with ν = n − 1 (GUM 4.2.3)
  }
  const divisors = { normal: 1, rectangular: sqrt3, triangular: Math.sqrt(6), u_shaped: Math.SQRT2 };
  for (const e of p.extras) {
    const half = e.unit === 'ppm' ? e.value * 1e-6 * f : e.value;
    lines.push([half / (e.distribution === 'normal' ? (e.divisor ?? 1) : divisors[e.distribution]), e.dof ?? Infinity]);
  }
  const uc = Math.sqrt(lines.reduce((a, [u]) => a + u * u, 0)); // GUM 5.1.2
  const denominator = lines.reduce((a, [u, nu]) => (Number.isFinite(nu) ? a + u ** 4 / nu : a), 0);
  const nuEff = denominator > 0 ? uc ** 4 / denominator : Infinity; // GUM G.2b
  // GUM G.6.4: ν_eff truncated to the next lower integer; k = 2 for ν = ∞ (Table G.2, last row). jstat's inverse t
  // is good to about 1e-7 up to ν = 10⁷ and drifts beyond; there t differs from 2 by less than (z³ + z)/(4ν) = 2.5e-7
  // (the first term of the usual expansion about the normal quantile), so the ν = ∞ value stands in.
  const nu = Math.max(1, Math.floor(nuEff));
  const k = Number.isFinite(nuEff) && nu <= 1e7 ? jstat.studentt.inv(1 - (1 - P_95_45) / 2, nu) : 2;
  const Uunrounded = k * uc;
  return { mean, n, uc, nuEff, k, Uunrounded, U: twoSignificant(Uunrounded) };
}

export type ByHandDecision = {
  decision: 'pass' | 'conditional_pass' | 'conditional_fail' | 'fail';
  guardBandHz: number;
  acceptanceLimitHz: number;
  tur: number;
};

/** ILAC-G8:09/2019 4.2.1–4.2.3 with w = U (the unrounded k·u_c) for the guarded rules; e = |error|. */
export function decisionByHand(errorHz: number, toleranceHz: number, U: number, rule: 'simple' | 'guarded' | 'guarded_binary'): ByHandDecision {
  const e = Math.abs(errorHz);
  const TL = toleranceHz;
  const w = rule === 'simple' ? 0 : U;
  let decision: ByHandDecision['decision'];
  if (rule === 'simple') decision = e <= TL ? 'pass' : 'fail';
  else if (rule === 'guarded_binary') decision = e < TL - w ? 'pass' : 'fail';
  else decision = e < TL - w ? 'pass' : e <= TL ? 'conditional_pass' : e <= TL + w ? 'conditional_fail' : 'fail';
  return { decision, guardBandHz: w, acceptanceLimitHz: TL - w, tur: TL / U };
}

/** Hz per dial unit of a direct-reading dial law. */
export function directSlope(law: { kind: string; unit?: string }): number {
  if (law.kind !== 'direct') throw new Error(`the by-hand budget handles direct-reading dials only (got ${law.kind})`);
  const perUnit: Record<string, number> = { Hz: 1, kHz: 1e3, MHz: 1e6 };
  const slope = perUnit[law.unit ?? ''];
  if (slope === undefined) throw new Error(`unknown dial unit ${law.unit}`);
  return slope;
}
