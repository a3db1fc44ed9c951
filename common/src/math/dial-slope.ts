import { dialToNominal, type DialLaw } from './dial-law.js';
import { MetrologyError } from './metrology-error.js';

/**
 * Local slope of a dial law, Hz per dial unit, by a numerical derivative with step
 * h = max(|span|·10⁻⁴, 10⁻⁹): the central difference (f(d + h) − f(d − h)) / 2h, or the one-sided
 * difference where one neighbour lies outside the law (a table's extrapolation limit). The dial
 * sensitivity coefficient of the uncertainty budget (JCGM 100:2008, 5.1.3, c = ∂f/∂d).
 *
 * @param law the range's dial law
 * @param dial the setting, in the dial's unit
 * @param dialSpan the range's dial span (sets the step)
 * @returns ∂f/∂d in Hz per dial unit
 * @throws {MetrologyError} 'outside_table' when the law gives no value on either side of the dial
 * @example dialSlope({ kind: 'direct', unit: 'kHz' }, 1750, 1000); // => 1000 (a kHz dial moves 1000 Hz per unit)
 */
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
  throw new MetrologyError('outside_table', `the dial law gives no slope at dial ${dial}`);
}
