/**
 * Number formatting for the engine's problem messages (SI, a few significant figures). Display
 * formatting of results belongs to the units module and the front ends, not here.
 */

/** Up to `sig` significant figures, without trailing zeros, minus sign as U+2212. */
export function fmtNum(x: number, sig = 4): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  const digits = Math.max(0, Math.min(10, sig - 1 - Math.floor(Math.log10(a))));
  let s = x.toFixed(digits);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  return s.replace('-', '−');
}

/** A temperature in °C, to 0.01 K. */
export function fmtT(tC: number): string {
  if (!Number.isFinite(tC)) return String(tC);
  let s = tC.toFixed(2);
  if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  if (s === '-0') s = '0';
  return `${s.replace('-', '−')} °C`;
}

/** A pressure: Pa below 10 kPa, kPa above. */
export function fmtPa(p: number): string {
  return Math.abs(p) < 10_000 ? `${fmtNum(p, 4)} Pa` : `${fmtNum(p / 1000, 6)} kPa`;
}

/** A humidity ratio in g/kg (in kg/kg when it is too large to scale, e.g. 1e308). */
export function fmtW(w: number): string {
  const g = w * 1000;
  return Number.isFinite(g) || !Number.isFinite(w) ? `${fmtNum(g, 4)} g/kg` : `${fmtNum(w, 4)} kg/kg`;
}

/** An enthalpy in kJ/kg. */
export function fmtH(h: number): string {
  return `${fmtNum(h / 1000, 5)} kJ/kg`;
}

/** A relative humidity (fraction) as a percentage (as a fraction when it is too large to scale). */
export function fmtRh(rh: number): string {
  const pct = rh * 100;
  return Number.isFinite(pct) || !Number.isFinite(rh) ? `${fmtNum(pct, 4)} %` : `${fmtNum(rh, 4)} (as a fraction)`;
}
