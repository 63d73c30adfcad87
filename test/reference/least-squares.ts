// Test helper shared by the reference checks that fit a line (or a few basis functions) to integrated proper time.

/**
 * Least squares by normal equations with partial pivoting. For small, well-conditioned bases only (e.g. time
 * in units of the span); an independent fit, not the SDK's, so the checks do not grade the SDK with itself.
 */
export function leastSquaresFit(rows: number[][], y: number[]): number[] {
  const m = rows[0]!.length;
  const M = Array.from({ length: m }, () => new Array<number>(m + 1).fill(0));
  rows.forEach((row, k) => {
    for (let i = 0; i < m; i++) {
      for (let j = 0; j < m; j++) M[i]![j]! += row[i]! * row[j]!;
      M[i]![m]! += row[i]! * y[k]!;
    }
  });
  for (let i = 0; i < m; i++) {
    let p = i;
    for (let r = i + 1; r < m; r++) if (Math.abs(M[r]![i]!) > Math.abs(M[p]![i]!)) p = r;
    [M[i], M[p]] = [M[p]!, M[i]!];
    for (let r = 0; r < m; r++) {
      if (r === i) continue;
      const f = M[r]![i]! / M[i]![i]!;
      for (let c = i; c <= m; c++) M[r]![c]! -= f * M[i]![c]!;
    }
  }
  return M.map((row, i) => row[m]! / row[i]!);
}
