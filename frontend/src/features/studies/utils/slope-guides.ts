/** Slopes of σ(τ) on log-log axes for the power-law noises (NIST SP 1065 §5.2, the Allan-type deviations), and a linear drift. */
export const SLOPE_GUIDES = [
  { slope: -1, label: 'τ⁻¹ white or flicker PM' },
  { slope: -0.5, label: 'τ^−½ white FM' },
  { slope: 0, label: 'τ⁰ flicker FM' },
  { slope: 0.5, label: 'τ^+½ random-walk FM' },
  { slope: 1, label: 'τ⁺¹ linear drift' },
] as const;

export type GuideLine = { label: string; x1: number; y1: number; x2: number; y2: number };

/** Each guide as a segment from τmin to τmax through the anchor point (τa, σa): σ(τ) = σa·(τ/τa)^slope. */
export function slopeGuideLines(anchor: { tau: number; sigma: number }, tauMin: number, tauMax: number): GuideLine[] {
  return SLOPE_GUIDES.map(({ slope, label }) => ({
    label,
    x1: tauMin,
    y1: anchor.sigma * (tauMin / anchor.tau) ** slope,
    x2: tauMax,
    y2: anchor.sigma * (tauMax / anchor.tau) ** slope,
  }));
}
