/**
 * "Did you mean" for unknown keys, columns and names: the closest allowed
 * word by edit distance (see {@link editDistance}) after lower-casing, accepted when
 * at most about a third of the word's letters differ (words under three
 * letters only by case; common practice, no source).
 */

/**
 * Edit distance with adjacent transpositions (optimal string alignment:
 * Damerau 1964, Levenshtein 1966): insertions, deletions, substitutions and
 * swaps of two neighbouring letters each count 1.
 */
export function editDistance(a: string, b: string): number {
  const m = b.length + 1;
  let pp = new Int32Array(m), prev = new Int32Array(m), cur = new Int32Array(m);
  for (let j = 0; j < m; j++) prev[j] = j;
  for (let i = 1; i <= a.length; i++) {
    cur[0] = i;
    for (let j = 1; j < m; j++) {
      let d = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + (a[i - 1] === b[j - 1] ? 0 : 1));
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, pp[j - 2] + 1);
      cur[j] = d;
    }
    [pp, prev, cur] = [prev, cur, pp];
  }
  return prev[b.length];
}

/**
 * The allowed word closest to `word`, or null when none is close.
 *
 * @example
 * closestWord('radiusdeg', ['frame', 'atDeg', 'radiusDeg']) === 'radiusDeg'
 * closestWord('colour', ['frame']) === null
 */
export function closestWord(word: string, allowed: readonly string[]): string | null {
  const w = word.toLowerCase();
  let best: string | null = null, bestD = Infinity;
  for (const a of allowed) {
    const d = editDistance(w, a.toLowerCase());
    if (d < bestD) { bestD = d; best = a; }
  }
  return best !== null && bestD <= (w.length < 3 ? 0 : Math.max(1, Math.floor(w.length / 3))) ? best : null;
}

/** ' (did you mean X?)' text for a hint, or '' when nothing is close. */
export function didYouMean(word: string, allowed: readonly string[]): string {
  const c = closestWord(word, allowed);
  return c === null ? '' : `did you mean '${c}'?`;
}
