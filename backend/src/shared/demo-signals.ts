// Invented signals for the demo data and the benchmarks: seeded, so every seed gives the same numbers.

/** Mulberry32: a small seeded generator of uniform numbers in [0, 1). */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let x = state;
    x = Math.imul(x ^ (x >>> 15), x | 1);
    x ^= x + Math.imul(x ^ (x >>> 7), x | 61);
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal numbers (Box–Muller) from a uniform generator. */
export function seededGaussian(seed: number): () => number {
  const uniform = seededRandom(seed);
  return () => {
    const u = Math.max(uniform(), 1e-12);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * uniform());
  };
}

/**
 * An LC oscillator whose dial was marked for inductance `inductanceH` and stray capacitance
 * `strayF`: the tuning capacitance at a mark is what gives the marked frequency then. Drift moves
 * L by a fraction and the stray capacitance by farads; f = 1/(2π√(L(C_dial + C_stray))).
 */
export function lcOscillator(opts: { inductanceH: number; strayF: number; inductanceDrift: number; strayDriftF: number }) {
  const { inductanceH, strayF, inductanceDrift, strayDriftF } = opts;
  return (markedHz: number): number => {
    const totalAtMark = 1 / ((2 * Math.PI * markedHz) ** 2 * inductanceH);
    const dialCapacitance = totalAtMark - strayF;
    return 1 / (2 * Math.PI * Math.sqrt(inductanceH * (1 + inductanceDrift) * (dialCapacitance + strayF + strayDriftF)));
  };
}

/** Warm-up after power-on: f(t) = f∞ + A·e^(−t/τ). */
export function warmupCurve(fInf: number, amplitude: number, tau: number): (t: number) => number {
  return (t) => fInf + amplitude * Math.exp(-t / tau);
}

/** A date `days` from `from`, as YYYY-MM-DD (UTC). */
export function addDays(from: Date, days: number): string {
  return new Date(from.getTime() + days * 86_400_000).toISOString().slice(0, 10);
}
