/** Reading the CLI's evaluation options (`--units`, `--pressure`, `--elevation`, `--no-claims`). */
import type { EvaluateSettings, UnitSystem } from './core';
import { lookupUnit, stdAtmPressure, toSI } from './core';
import { DEFAULT_MAX_NOTE_BYTES } from '@dewmark/files';

/** A usage error: the message says what is wrong with which option and how to write it. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/** Raw option values as commander hands them over. */
export interface RawEvalOptions {
  units?: string;
  pressure?: string;
  elevation?: string;
  claims?: boolean;
  /** `--max-note-size`: the most one note may be, in MB. */
  maxNoteSize?: string;
}

/** The most bytes one note may be: `--max-note-size` (MB), or the default. Throws {@link UsageError}. */
export function maxNoteBytes(o: RawEvalOptions): number {
  if (o.maxNoteSize === undefined) return DEFAULT_MAX_NOTE_BYTES;
  const text = o.maxNoteSize.trim().replace(/\s*MB$/i, '');
  const v = /^(\d+(\.\d+)?)$/.test(text) ? Number(text) : NaN;
  if (!(v > 0) || v > 1_000_000) {
    throw new UsageError(
      `--max-note-size must be a size in MB greater than 0, e.g. --max-note-size 64 (got '${o.maxNoteSize}')`,
    );
  }
  return Math.floor(v * 1024 * 1024);
}

/** Splits `84.5kPa` / `1600 m` into the number and the unit. */
function splitValue(text: string): { value: number; unit: string } | null {
  const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(\S*)\s*$/.exec(text);
  if (!m) return null;
  const value = Number(m[1]);
  return Number.isFinite(value) ? { value, unit: m[2] ?? '' } : null;
}

/** Converts the options to evaluator settings; throws {@link UsageError} for a bad value. */
export function toSettings(o: RawEvalOptions): Partial<EvaluateSettings> {
  const s: Partial<EvaluateSettings> = {};
  if (o.units !== undefined) {
    const u = o.units.toUpperCase();
    if (u !== 'SI' && u !== 'IP') throw new UsageError(`--units must be SI or IP, not '${o.units}'`);
    s.units = u as UnitSystem;
  }
  if (o.pressure !== undefined && o.elevation !== undefined) {
    throw new UsageError('give either --pressure or --elevation, not both');
  }
  if (o.pressure !== undefined) {
    const v = splitValue(o.pressure);
    const unit = v?.unit ? lookupUnit(v.unit) : undefined;
    if (!v?.unit)
      throw new UsageError(
        `--pressure needs a value with a unit, e.g. --pressure 84.5kPa or --pressure 12.25psia (got '${o.pressure}')`,
      );
    if (unit?.dimension !== 'pressure')
      throw new UsageError(`--pressure: '${v.unit}' is not a pressure unit; use kPa, Pa, hPa, bar, atm, psia or inHg`);
    const pa = toSI(v.value, unit);
    if (!(pa > 0)) throw new UsageError(`--pressure must be a positive absolute pressure (got '${o.pressure}')`);
    s.pressurePa = pa;
    s.pressureOrigin = `--pressure ${o.pressure}`;
  }
  if (o.elevation !== undefined) {
    const v = splitValue(o.elevation);
    const unit = v?.unit ? lookupUnit(v.unit) : undefined;
    if (!v?.unit)
      throw new UsageError(
        `--elevation needs a value with a unit, e.g. --elevation 1600m or --elevation 5250ft (got '${o.elevation}')`,
      );
    if (unit?.dimension !== 'length')
      throw new UsageError(`--elevation: '${v.unit}' is not a length unit; use m or ft`);
    const z = toSI(v.value, unit);
    let pa: number;
    try {
      pa = stdAtmPressure(z);
    } catch (err) {
      throw new UsageError(`--elevation ${o.elevation}: ${err instanceof Error ? err.message : String(err)}`);
    }
    s.pressurePa = pa;
    s.pressureOrigin = `--elevation ${o.elevation} (standard atmosphere)`;
  }
  if (o.claims === false) s.checkClaims = false;
  return s;
}
