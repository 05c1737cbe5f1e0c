/**
 * The one "did you mean" engine: the closest of some candidate words to a word that is not one of
 * them (a misspelt state name, key, keyword or unit), by one distance — the optimal-string-
 * alignment edit distance (insert, delete, substitute, or swap two neighbours: one edit each) —
 * with a bound on the work that no input can break:
 *
 * - **length cap**: a word or candidate longer than {@link MAX_SUGGEST_LENGTH} is never compared
 *   (a 50,000-letter name is not a typo of anything);
 * - **bounded distance**: a typo is at most {@link MAX_SUGGEST_DISTANCE} edits away, so the
 *   distance is computed only in a band of that width around the diagonal and stops as soon as
 *   every cell of a row is beyond it; candidates whose length differs by more are skipped unread;
 * - **index**: many candidates are indexed once by the strings left after deleting up to two
 *   characters ({@link SuggestIndex}), so a word looks up only the candidates that can be within
 *   two edits instead of scanning all of them (four thousand unknown names against four thousand
 *   defined ones stay linear);
 * - **candidate limit**: at most {@link MAX_VERIFIED} candidates are measured, and
 *   {@link MAX_VISITED} index entries visited, per word (the nearest are usually found first: the
 *   word itself is looked up before its deletions).
 *
 * Every step can be counted in a {@link SuggestWork} (tests bound the cost in operations, not time).
 */

/** Words and candidates longer than this (UTF-16 code units) get and give no suggestion. */
export const MAX_SUGGEST_LENGTH = 40;

/** The largest distance any caller accepts (the index is built for it). */
export const MAX_SUGGEST_DISTANCE = 2;

/** At most this many candidates are measured for one word. */
export const MAX_VERIFIED = 64;

/** At most this many index entries are visited for one word (many are shared by names already measured). */
export const MAX_VISITED = 8 * MAX_VERIFIED;

/** Up to this many candidates are scanned directly; more are indexed. */
const SCAN_MAX = 32;

/** An optional counter of the work done: distance cells, index entries and look-ups. */
export interface SuggestWork {
  ops: number;
}

/**
 * The optimal-string-alignment distance between `a` and `b` when it is at most `max`, else
 * `max + 1`. Only cells within `max` of the diagonal are computed, and the computation stops at
 * the first row whose cells all exceed `max`: at most (2·max + 1)·min(|a|, |b|) cells.
 */
export function distanceWithin(a: string, b: string, max: number, work?: SuggestWork): number {
  const m = a.length;
  const n = b.length;
  if (Math.abs(m - n) > max) return max + 1;
  if (a === b) return 0;
  if (m === 0 || n === 0) return Math.max(m, n);
  const INF = max + 1;
  const width = n + 1;
  // Three rows (two back for the swap of neighbours), reused between calls; cells outside the band are INF.
  if (rows.length < 3 * width) rows = new Int32Array(Math.max(3 * width, 2 * rows.length));
  let prev2 = 0;
  let prev = width;
  let cur = 2 * width;
  rows.fill(INF, 0, 3 * width);
  for (let j = 0; j <= Math.min(n, max); j++) rows[prev + j] = j;
  let cells = 0;
  for (let i = 1; i <= m; i++) {
    const lo = Math.max(1, i - max);
    const hi = Math.min(n, i + max);
    rows.fill(INF, cur + Math.max(0, lo - 2), cur + Math.min(width, hi + 2));
    rows[cur] = i <= max ? i : INF;
    let rowMin = rows[cur]!;
    const ai = a.charCodeAt(i - 1);
    for (let j = lo; j <= hi; j++) {
      const bj = b.charCodeAt(j - 1);
      let v = Math.min(rows[prev + j]! + 1, rows[cur + j - 1]! + 1, rows[prev + j - 1]! + (ai === bj ? 0 : 1));
      if (i > 1 && j > 1 && ai === b.charCodeAt(j - 2) && a.charCodeAt(i - 2) === bj)
        v = Math.min(v, rows[prev2 + j - 2]! + 1);
      if (v > INF) v = INF;
      rows[cur + j] = v;
      if (v < rowMin) rowMin = v;
    }
    cells += hi - lo + 1;
    if (rowMin > max) {
      if (work) work.ops += cells;
      return INF;
    }
    const t = prev2;
    prev2 = prev;
    prev = cur;
    cur = t;
  }
  if (work) work.ops += cells;
  return Math.min(rows[prev + n]!, INF);
}

/** The rows of {@link distanceWithin}, kept between calls (it is not re-entered). */
let rows = new Int32Array(3 * (MAX_SUGGEST_LENGTH + 1));

/** The strings left after deleting up to `k` characters of `s` (with `s` itself), without repeats. */
function deletions(s: string, k: number, work?: SuggestWork): Set<string> {
  const out = new Set<string>([s]);
  let frontier: string[] = [s];
  for (let d = 0; d < k; d++) {
    const next: string[] = [];
    for (const t of frontier) {
      for (let i = 0; i < t.length; i++) {
        const v = t.slice(0, i) + t.slice(i + 1);
        if (work) work.ops++;
        if (!out.has(v)) {
          out.add(v);
          next.push(v);
        }
      }
    }
    frontier = next;
  }
  return out;
}

/** The nearest candidate: its position in the candidate list and its distance. */
export interface Nearest {
  index: number;
  distance: number;
}

/**
 * An index of candidate words for repeated look-ups: by each string left after deleting up to
 * {@link MAX_SUGGEST_DISTANCE} characters. Two words within that many edits share such a string,
 * so a look-up measures only the candidates found under the word's own deletions. Building it
 * costs a few dozen entries per short candidate; candidates over {@link MAX_SUGGEST_LENGTH} are
 * left out.
 */
export class SuggestIndex {
  readonly candidates: readonly string[];
  private readonly byDeletion: Map<string, number[]> | null;

  constructor(candidates: Iterable<string>, work?: SuggestWork) {
    this.candidates = [...candidates];
    if (this.candidates.length <= SCAN_MAX) {
      this.byDeletion = null;
      return;
    }
    const map = new Map<string, number[]>();
    this.candidates.forEach((c, i) => {
      if (c.length > MAX_SUGGEST_LENGTH) return;
      for (const v of deletions(c, MAX_SUGGEST_DISTANCE, work)) {
        const list = map.get(v);
        if (list) {
          if (list[list.length - 1] !== i) list.push(i);
        } else map.set(v, [i]);
      }
    });
    this.byDeletion = map;
  }

  /**
   * The candidate nearest to `word` within `max` edits (ties: the earlier candidate), skipping a
   * candidate equal to the word; null when none is that close, the word is empty or over the
   * length cap.
   */
  nearest(word: string, max: number, work?: SuggestWork): Nearest | null {
    const k = Math.min(max, MAX_SUGGEST_DISTANCE);
    if (k < 0 || word.length === 0 || word.length > MAX_SUGGEST_LENGTH) return null;
    let best: Nearest | null = null;
    const consider = (i: number): void => {
      const c = this.candidates[i]!;
      if (c === word || c.length > MAX_SUGGEST_LENGTH) return;
      const d = distanceWithin(word, c, k, work);
      if (d <= k && (best === null || d < best.distance || (d === best.distance && i < best.index)))
        best = { index: i, distance: d };
    };
    if (this.byDeletion === null) {
      for (let i = 0; i < this.candidates.length; i++) {
        if (work) work.ops++;
        if (Math.abs(this.candidates[i]!.length - word.length) <= k) consider(i);
      }
      return best;
    }
    const seen = new Set<number>();
    let verified = 0;
    let visited = 0;
    for (const v of deletions(word, k, work)) {
      const list = this.byDeletion.get(v);
      if (work) work.ops++;
      if (!list) continue;
      for (const i of list) {
        // Short deletion strings are shared by many names: the visits are bounded too.
        if (work) work.ops++;
        if (++visited > MAX_VISITED) return best;
        if (seen.has(i)) continue;
        seen.add(i);
        if (verified++ >= MAX_VERIFIED) return best;
        consider(i);
      }
    }
    return best;
  }
}

/** The nearest of `candidates` to `word` within `max` edits (see {@link SuggestIndex.nearest}). */
export function nearest(
  word: string,
  candidates: readonly string[] | SuggestIndex,
  max: number,
  work?: SuggestWork,
): Nearest | null {
  const index = candidates instanceof SuggestIndex ? candidates : new SuggestIndex(candidates, work);
  return index.nearest(word, max, work);
}

/**
 * The edits accepted for a word of `length` when guessing a name or a key: none for one character
 * (replacing its only character is no typo: `Z` is not a misspelt `A`), one up to three
 * characters, two beyond.
 */
export function nameTolerance(length: number): number {
  return length <= 1 ? 0 : length <= 3 ? 1 : 2;
}

/**
 * The candidate a misspelt `word` probably meant, ignoring case: a candidate equal to it but for
 * case first, else the nearest within {@link nameTolerance} edits; null when none is close. A
 * candidate equal to `word` itself is never suggested. `candidates` may be an index built once
 * with {@link caseFoldedIndex} for many look-ups.
 */
export function suggestName(
  word: string,
  candidates: Iterable<string> | FoldedIndex,
  work?: SuggestWork,
): string | null {
  const folded = candidates instanceof FoldedIndex ? candidates : caseFoldedIndex(candidates, work);
  return folded.suggest(word, work);
}

/** Candidates indexed by their lowercase form, for {@link suggestName}. */
export class FoldedIndex {
  private readonly originals: readonly string[];
  private readonly exact = new Map<string, number[]>();
  private readonly index: SuggestIndex;

  constructor(candidates: Iterable<string>, work?: SuggestWork) {
    this.originals = [...candidates];
    const lower = this.originals.map((c) => c.toLowerCase());
    lower.forEach((l, i) => {
      const list = this.exact.get(l);
      if (list) list.push(i);
      else this.exact.set(l, [i]);
    });
    this.index = new SuggestIndex(lower, work);
  }

  suggest(word: string, work?: SuggestWork): string | null {
    if (word.length === 0 || word.length > MAX_SUGGEST_LENGTH) return null;
    const lower = word.toLowerCase();
    for (const i of this.exact.get(lower) ?? []) if (this.originals[i] !== word) return this.originals[i]!;
    const n = this.index.nearest(lower, nameTolerance(word.length), work);
    return n === null ? null : this.originals[n.index]!;
  }
}

/** Builds a {@link FoldedIndex} once, for many {@link suggestName} look-ups over the same candidates. */
export function caseFoldedIndex(candidates: Iterable<string>, work?: SuggestWork): FoldedIndex {
  return new FoldedIndex(candidates, work);
}
