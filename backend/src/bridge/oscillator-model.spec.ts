import { fitWarmup, overlappingAdev } from '@kilocycle/common/math';
import { LcOscillator, parseScpiNumber, scpiNumber, seededRandom } from './oscillator-model.js';

const RANGE = { dialMin: 3500, dialMax: 7500, freqMinHz: 3_500_000, freqMaxHz: 7_500_000 };

describe('LcOscillator', () => {
  describe('read()', () => {
    it('should warm up exponentially: the fitted time constant and settled frequency come back', () => {
      const osc = new LcOscillator({ profile: 'warmup', ...RANGE, dial: 7000, seed: 7 });
      const t: number[] = [];
      const f: number[] = [];
      for (let i = 0; i < 3600; i++) {
        t.push(i);
        f.push(osc.read(i).frequency);
      }
      const fit = fitWarmup(t, f);
      // Model: τ = 420 s, A = −180 ppm of the settled frequency; noise is parts in 10⁸.
      expect(fit.tau).toBeGreaterThan(400);
      expect(fit.tau).toBeLessThan(440);
      const settled = osc.settled(7000);
      expect(Math.abs(fit.fInf - settled) / settled).toBeLessThan(2e-6);
      expect(fit.amplitude / settled).toBeCloseTo(-180e-6, 5);
    });

    it('should hold steady in the stable profile, with a frequency noise floor in parts in 10⁸', () => {
      const osc = new LcOscillator({ profile: 'stable', ...RANGE, seed: 3 });
      const f = Array.from({ length: 4096 }, (_, i) => osc.read(i).frequency);
      const mean = f.reduce((a, b) => a + b, 0) / f.length;
      expect(Math.abs(mean - osc.settled(5500)) / mean).toBeLessThan(1e-6);
      const points = overlappingAdev(
        f.map((x) => (x - mean) / mean),
        1,
      );
      const at1 = points.find((p) => p.tau === 1)!;
      expect(at1.deviation).toBeGreaterThan(1e-8);
      expect(at1.deviation).toBeLessThan(1e-7);
    });

    it('should sweep the dial up and back in steps, with a dial error of about a tenth of a percent', () => {
      const osc = new LcOscillator({ profile: 'sweep', ...RANGE, seed: 1, readingsPerPoint: 2, sweepPoints: 5 });
      const dials = Array.from({ length: 18 }, (_, i) => osc.read(i).dial);
      expect(dials).toEqual([3500, 3500, 4500, 4500, 5500, 5500, 6500, 6500, 7500, 7500, 6500, 6500, 5500, 5500, 4500, 4500, 3500, 3500]);
      for (const dial of [3500, 5500, 7500]) {
        const error = (osc.settled(dial) - osc.nominal(dial)) / osc.nominal(dial);
        expect(Math.abs(error)).toBeGreaterThan(1e-4);
        expect(Math.abs(error)).toBeLessThan(3e-3);
      }
    });

    it('should repeat exactly with the same seed', () => {
      const a = new LcOscillator({ profile: 'warmup', ...RANGE, seed: 11 });
      const b = new LcOscillator({ profile: 'warmup', ...RANGE, seed: 11 });
      for (let i = 0; i < 50; i++) expect(a.read(i)).toEqual(b.read(i));
    });
  });

  it('should draw uniform numbers in [0, 1)', () => {
    const next = seededRandom(5);
    const xs = Array.from({ length: 10000 }, next);
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...xs)).toBeLessThan(1);
    expect(xs.reduce((a, b) => a + b, 0) / xs.length).toBeCloseTo(0.5, 1);
  });
});

describe('SCPI numbers', () => {
  it.each([
    [7000123.456, '+7.00012345600E+06'],
    [0.5, '+5.00000000000E-01'],
    [-12.25, '-1.22500000000E+01'],
  ])('should write %p as %s', (value, text) => {
    expect(scpiNumber(value)).toBe(text);
  });

  it.each([
    ['+7.00012345600E+06', 7000123.456],
    ['  7.05 MHz\r', 7_050_000],
    ['1735 kHz', 1_735_000],
    ['12.5', 12.5],
    ['9.91E+37', null],
    ['', null],
    ['ERR', null],
    ['7,05', null],
  ])('should read %p as %p', (text, value) => {
    const read = parseScpiNumber(text);
    if (value === null) expect(read).toBeNull();
    else expect(read).toBeCloseTo(value, 6);
  });
});
