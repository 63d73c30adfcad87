/**
 * "Did you mean …" for mistyped command and flag names: the known names closest to what was typed by
 * Damerau–Levenshtein distance (optimal string alignment: insertions, deletions, substitutions and
 * transpositions of adjacent characters; F. J. Damerau, Comm. ACM 7(3) 1964 [M]), or that start with it.
 */

/** Cell [i][j] of the distance table, which the loops fill before reading it (a RangeError names a missed cell). */
function cell(d: readonly (readonly number[])[], i: number, j: number): number {
  const value = d[i]?.[j];
  if (value === undefined) throw new RangeError(`edit-distance table cell [${i}][${j}] read before it was filled`);
  return value;
}

/** Optimal-string-alignment distance between `a` and `b` (each edit, and each adjacent swap, costs 1). */
export function editDistance(a: string, b: string): number {
  const cols = b.length + 1;
  const d: number[][] = Array.from({ length: a.length + 1 }, (_, i) =>
    Array.from({ length: cols }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)),
  );
  for (const [i, row] of d.entries()) {
    if (i === 0) continue;
    for (let j = 1; j < cols; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let best = Math.min(cell(d, i - 1, j) + 1, cell(d, i, j - 1) + 1, cell(d, i - 1, j - 1) + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1])
        best = Math.min(best, cell(d, i - 2, j - 2) + 1);
      row[j] = best;
    }
  }
  return cell(d, a.length, b.length);
}

/** Largest distance still suggested: 1 for names up to 4 characters, 2 up to 8, 3 beyond (small on purpose). */
function threshold(length: number): number {
  return length <= 4 ? 1 : length <= 8 ? 2 : 3;
}

/**
 * The known names a mistyped `typed` most likely meant (case-insensitive): those at the smallest
 * distance within the threshold, else the names it is a prefix of (at least 3 characters typed).
 * Empty when nothing is close.
 */
export function closestNames(typed: string, known: readonly string[]): string[] {
  const t = typed.toLowerCase();
  const scored = known.map((name) => ({ name, distance: editDistance(t, name.toLowerCase()) }));
  const best = Math.min(...scored.map((s) => s.distance));
  if (best <= threshold(t.length)) return scored.filter((s) => s.distance === best).map((s) => s.name);
  if (t.length >= 3) return known.filter((name) => name.toLowerCase().startsWith(t));
  return [];
}

/** ` (did you mean --a or --b?)`-style suffix for a message, or '' when nothing is close; `prefix` is put before each name. */
export function didYouMean(typed: string, known: readonly string[], prefix = ''): string {
  const names = closestNames(typed, known)
    .slice(0, 3)
    .map((n) => `${prefix}${n}`);
  if (names.length === 0) return '';
  return `; did you mean ${names.length === 1 ? names[0] : `${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}`}?`;
}
