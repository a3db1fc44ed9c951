import { LcOscillator, type Profile } from '../oscillator-model.js';
import { sleep, type Captured, type CounterSource, type SourceContext } from './counter-source.js';

export type SimulateOptions = { profile: Profile; intervalMs: number; speed: number; seed?: number; dial?: number };

/** Readings at most this many a timer tick, so a very short interval cannot starve the event loop. */
const MAX_PER_TICK = 2000;

/**
 * A simulated oscillator on the run's range. Readings come every `intervalMs` of real time and carry
 * t = simulated seconds since power-on, which runs `speed` times faster than the clock. For a phase run it
 * acts as a time-interval counter against a reference at the oscillator's first frequency: each reading is
 * the phase x (s), the running sum of the fractional frequency times the interval, to the picosecond.
 */
export class SimulateSource implements CounterSource {
  readonly label: string;
  readonly skipped = 0;
  private readonly abort = new AbortController();

  constructor(private readonly options: SimulateOptions) {
    this.label = `simulated ${options.profile} (×${options.speed}, every ${options.intervalMs} ms)`;
  }

  async run(emit: (reading: Captured) => void, context: SourceContext): Promise<void> {
    const { range } = context.attach;
    const oscillator = new LcOscillator({
      profile: this.options.profile,
      dialMin: range.dialMin,
      dialMax: range.dialMax,
      freqMinHz: range.freqMinHz,
      freqMaxHz: range.freqMaxHz,
      dial: this.options.dial,
      seed: this.options.seed,
    });
    const stepS = (this.options.intervalMs / 1000) * this.options.speed;
    const tick = Math.max(2, Math.min(this.options.intervalMs, 50));
    const started = performance.now();
    let emitted = 0;
    const phase = context.attach.dataKind === 'phase';
    let reference = 0;
    let x = 0;
    while (!this.abort.signal.aborted) {
      const due = Math.floor((performance.now() - started) / this.options.intervalMs) + 1;
      for (let n = 0; emitted < due && n < MAX_PER_TICK && !this.abort.signal.aborted; n++) {
        const t = emitted * stepS;
        const { dial, frequency } = oscillator.read(t);
        const at = Math.round(t * 1e6) / 1e6;
        if (phase) {
          if (emitted === 0) reference = frequency;
          else x += ((frequency - reference) / reference) * stepS;
          emit({ t: at, timeInterval: Math.round(x * 1e12) / 1e12 });
        } else {
          emit({ t: at, dial, frequency: Math.round(frequency * 1000) / 1000 });
        }
        emitted++;
      }
      await sleep(tick, this.abort.signal);
    }
  }

  stop(): void {
    this.abort.abort();
  }
}
