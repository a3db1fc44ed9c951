/**
 * A simulated LC oscillator as a frequency counter would see it: exponential warm-up after power-on,
 * a dial that does not quite track its marks, and white plus flicker frequency noise.
 * Used by `bridge --source simulate:…` and by the SCPI counter simulator.
 */

export const PROFILES = ['warmup', 'sweep', 'stable'] as const;
export type Profile = (typeof PROFILES)[number];

export type OscillatorOptions = {
  profile: Profile;
  /** The range the dial covers (a direct-reading dial: nominal frequency is linear in the dial). */
  dialMin: number;
  dialMax: number;
  freqMinHz: number;
  freqMaxHz: number;
  /** Dial setting for the warmup and stable profiles (default: mid-range). */
  dial?: number;
  /** Seed of the noise, so a run can be repeated exactly. */
  seed?: number;
  /** Readings taken at each dial point in a sweep before the dial moves on. */
  readingsPerPoint?: number;
  /** Dial points in a sweep, ends included. */
  sweepPoints?: number;
};

/** Warm-up amplitude as a fraction of frequency (the oscillator starts low and rises) and its time constant (simulated seconds; the live browser test checks the fitted τ against it). */
export const WARMUP_FRACTION = -180e-6;
export const WARMUP_TAU_S = 420;
/** A slow residual drift after warm-up, fraction per second. */
const AGING_PER_S = 2e-11;
/** Dial error: scale error, offset and a mid-range bow, as fractions of the nominal frequency. */
const SCALE_ERROR = 0.0011;
const OFFSET_FRACTION = -0.0004;
const BOW_FRACTION = 0.0009;
/** White FM (per reading) and flicker FM (floor) levels, fractional. */
const WHITE_FM = 3e-8;
const FLICKER_FM = 1.2e-8;
/** Flicker noise is built from relaxation processes with time constants spread over these octave pairs. */
const FLICKER_STAGES = 9;

/** mulberry32: a small, fast, seedable generator (uniform in [0, 1)). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export class LcOscillator {
  private readonly uniform: () => number;
  private spare: number | null = null;
  private readonly flicker: number[] = new Array<number>(FLICKER_STAGES).fill(0);
  private lastT: number | null = null;
  private count = 0;

  constructor(private readonly options: OscillatorOptions) {
    if (!(options.dialMax > options.dialMin) || !(options.freqMaxHz > options.freqMinHz) || options.freqMinHz <= 0) {
      throw new Error('the simulated range needs dialMax > dialMin and freqMaxHz > freqMinHz > 0');
    }
    this.uniform = seededRandom(options.seed ?? 20251201);
    // Start the flicker processes in their steady state.
    for (let k = 0; k < FLICKER_STAGES; k++) this.flicker[k] = this.gauss();
  }

  /** Nominal frequency of a dial setting (what the dial's marks say). */
  nominal(dial: number): number {
    const { dialMin, dialMax, freqMinHz, freqMaxHz } = this.options;
    return freqMinHz + ((dial - dialMin) / (dialMax - dialMin)) * (freqMaxHz - freqMinHz);
  }

  /** What the oscillator really produces at a dial setting once settled: the dial's marks are slightly off. */
  settled(dial: number): number {
    const { dialMin, dialMax } = this.options;
    const nominal = this.nominal(dial);
    const u = (dial - dialMin) / (dialMax - dialMin);
    return nominal * (1 + SCALE_ERROR) + this.nominal((dialMin + dialMax) / 2) * (OFFSET_FRACTION + BOW_FRACTION * Math.sin(Math.PI * u));
  }

  /** The dial setting of the n-th reading (null when the profile leaves the dial alone). */
  dialFor(n: number): number | null {
    const { profile, dialMin, dialMax } = this.options;
    if (profile !== 'sweep') return null;
    const points = Math.max(2, this.options.sweepPoints ?? 11);
    const per = Math.max(1, this.options.readingsPerPoint ?? 3);
    const step = Math.floor(n / per) % (2 * points - 2);
    const index = step < points ? step : 2 * points - 2 - step; // up, then back down
    return dialMin + ((dialMax - dialMin) * index) / (points - 1);
  }

  /**
   * The next reading at `t` seconds since power-on (t must not go backwards). The noise processes
   * advance by the time since the previous reading, so irregular query times behave physically.
   */
  read(t: number): { dial: number | null; frequency: number } {
    const dial = this.dialFor(this.count++);
    const setting = dial ?? this.options.dial ?? (this.options.dialMin + this.options.dialMax) / 2;
    const base = this.settled(setting);
    const dt = this.lastT === null ? 1 : Math.max(1e-3, t - this.lastT);
    this.lastT = t;
    let flicker = 0;
    for (let k = 0; k < FLICKER_STAGES; k++) {
      const tau = 0.5 * 4 ** k; // 0.5 s … 32 768 s
      const rho = Math.exp(-dt / tau);
      this.flicker[k] = rho * this.flicker[k] + Math.sqrt(1 - rho * rho) * this.gauss();
      flicker += this.flicker[k];
    }
    const y = WHITE_FM * this.gauss() + (FLICKER_FM / Math.sqrt(FLICKER_STAGES)) * flicker;
    const warm = this.options.profile === 'warmup' ? WARMUP_FRACTION * Math.exp(-t / WARMUP_TAU_S) + AGING_PER_S * t : 0;
    return { dial, frequency: base * (1 + warm + y) };
  }

  /** Standard normal deviate (Box–Muller, polar form). */
  private gauss(): number {
    if (this.spare !== null) {
      const s = this.spare;
      this.spare = null;
      return s;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * this.uniform() - 1;
      v = 2 * this.uniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const m = Math.sqrt((-2 * Math.log(s)) / s);
    this.spare = v * m;
    return u * m;
  }
}

/** A counter's reading as SCPI instruments send it: `+7.00012345678E+06`. */
export function scpiNumber(value: number, digits = 12): string {
  const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
  const e = Number(exponent);
  return `${value >= 0 ? '+' : ''}${mantissa}E${e < 0 ? '-' : '+'}${String(Math.abs(e)).padStart(2, '0')}`;
}

/** Reads a counter's answer: a number in SCPI notation, optionally followed by a unit; null when it is none. */
export function parseScpiNumber(text: string): number | null {
  const match = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(hz|khz|mhz|ghz)?\s*$/i.exec(text);
  if (!match) return null;
  const value = Number(match[1]);
  const unit = (match[2] ?? 'hz').toLowerCase();
  const scale = unit === 'khz' ? 1e3 : unit === 'mhz' ? 1e6 : unit === 'ghz' ? 1e9 : 1;
  // 9.91E37 is SCPI's "not a number" (no signal, overload): not a measurement.
  if (!Number.isFinite(value) || Math.abs(value) >= 9.9e37) return null;
  return value * scale;
}
