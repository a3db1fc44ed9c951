/**
 * A part-per-million figure of a frequency as hertz: Hz = ppm × 10⁻⁶ × f (10⁻⁶ by the definition of
 * "parts per million", SI Brochure 9th ed. 2019, 5.4.7 on ppm as a ratio).
 *
 * @param ppm the figure, parts per million of nominalHz
 * @param nominalHz the frequency it is a fraction of, Hz
 * @returns the figure in Hz
 * @example ppmToHz(2, 7_000_000); // => 14 (2 ppm of 7 MHz)
 */
export function ppmToHz(ppm: number, nominalHz: number): number {
  return ppm * 1e-6 * nominalHz;
}
