/**
 * A bracketed one-dimensional root finder for the state solver's less frequent pairs: regula
 * falsi with the Illinois modification, with a bisection every third step so that the bracket at least
 * halves every three evaluations. Always bounded; never leaves the bracket.
 */

/**
 * Root of f on [a, b] where f(a) and f(b) have opposite signs (or one is 0), to within `xtol`.
 * `fa`, `fb` are f(a), f(b). Returns NaN when `maxIter` is reached.
 */
export function findRoot(
  f: (x: number) => number,
  a: number,
  b: number,
  fa: number,
  fb: number,
  xtol = 1e-13,
  maxIter = 200,
): number {
  if (fa === 0) return a;
  if (fb === 0) return b;
  let side = 0;
  for (let i = 0; i < maxIter; i++) {
    let x = (a * fb - b * fa) / (fb - fa);
    // Every third step, or when the interpolation is not strictly inside, bisect.
    if (!(x > Math.min(a, b) && x < Math.max(a, b)) || i % 3 === 2) x = 0.5 * (a + b);
    const fx = f(x);
    if (fx === 0) return x;
    if (fx > 0 === fb > 0) {
      b = x;
      fb = fx;
      if (side === -1) fa *= 0.5;
      side = -1;
    } else {
      a = x;
      fa = fx;
      if (side === 1) fb *= 0.5;
      side = 1;
    }
    const m = 0.5 * (a + b);
    // Done when the bracket is within tolerance or no double lies strictly inside it.
    if (Math.abs(b - a) <= xtol * (1 + Math.abs(x)) || m === a || m === b) return m;
  }
  return Number.NaN;
}
