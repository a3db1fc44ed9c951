/**
 * Bounds of what a line may hold, so every total stays an exact integer far inside Number's safe range:
 * 1,000,000 units (in thousandths) × 100,000,000.00 a unit is 10^17 minor units before the division by 1000.
 */
export const MONEY_LIMITS = {
  /** Largest unit price, in minor units (100 million in major units). */
  maxUnitPriceMinor: 10_000_000_000,
  /** Largest quantity, in thousandths (one million units). */
  maxQuantityMilli: 1_000_000_000,
  /** Largest tax rate, in basis points (100 %). */
  maxRateBasisPoints: 10_000,
  /** Most lines on one document. */
  maxLines: 200,
} as const;
