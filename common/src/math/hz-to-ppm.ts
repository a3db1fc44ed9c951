/**
 * A frequency difference as parts per million of a nominal frequency: ppm = Δf / f × 10⁶ (the inverse
 * of {@link ppmToHz}; ppm as a ratio, SI Brochure 9th ed. 2019, 5.4.7).
 *
 * @param hz the difference, Hz
 * @param nominalHz the frequency it is a fraction of, Hz (not zero)
 * @returns the difference in ppm
 * @example hzToPpm(35, 7_000_000); // => 5 (35 Hz high at 7 MHz)
 */
export function hzToPpm(hz: number, nominalHz: number): number {
  return (hz / nominalHz) * 1e6;
}
