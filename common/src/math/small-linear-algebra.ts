// Internal: dense solves for the tiny (≤ 4 × 4) normal-equation systems of the fits.

/**
 * Inverse of a small square matrix by Gauss–Jordan elimination with partial pivoting.
 * Returns null when a pivot falls below `relativeTolerance` × the largest diagonal
 * element (numerically singular).
 */
export function invertSmall(matrix: readonly (readonly number[])[], relativeTolerance = 1e-13): number[][] | null {
  const size = matrix.length;
  const work = matrix.map((row, i) => [...row, ...Array.from({ length: size }, (_, j) => (i === j ? 1 : 0))]);
  let scale = 0;
  for (let i = 0; i < size; i++) scale = Math.max(scale, Math.abs(matrix[i]![i]!));
  if (!(scale > 0) || !Number.isFinite(scale)) return null;
  for (let column = 0; column < size; column++) {
    let pivotRow = column;
    for (let row = column + 1; row < size; row++) {
      if (Math.abs(work[row]![column]!) > Math.abs(work[pivotRow]![column]!)) pivotRow = row;
    }
    const pivot = work[pivotRow]![column]!;
    if (!(Math.abs(pivot) > relativeTolerance * scale)) return null;
    [work[column], work[pivotRow]] = [work[pivotRow]!, work[column]!];
    const pivotLine = work[column]!;
    for (let j = 0; j < 2 * size; j++) pivotLine[j]! /= pivot;
    for (let row = 0; row < size; row++) {
      if (row === column) continue;
      const line = work[row]!;
      const factor = line[column]!;
      if (factor === 0) continue;
      for (let j = 0; j < 2 * size; j++) line[j] = line[j]! - factor * pivotLine[j]!;
    }
  }
  return work.map((row) => row.slice(size));
}

/** Matrix–vector product for small dense matrices. */
export function multiply(matrix: readonly (readonly number[])[], vector: readonly number[]): number[] {
  return matrix.map((row) => row.reduce((sum, value, j) => sum + value * vector[j]!, 0));
}
