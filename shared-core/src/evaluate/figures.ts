/**
 * Figures in the evaluator's messages, in the note's unit system: the engine's messages carry
 * their figures as numbers (`physics/message.ts`), and the evaluator's own messages take theirs
 * from here, so every figure a diagnostic shows comes from the one formatter (`figure` of the
 * units layer) in the units the note reads in — psia, °F, gr/lb, Btu/lb, lb/h, cfm, Btu/h in an
 * IP note; kPa, °C, g/kg, kJ/kg, kg/s, m³/s, kW in an SI note.
 */
import type { MessageFigure, MessageText } from '../physics/message';
import { renderText } from '../physics/message';
import {
  baseUnit,
  displaySymbol,
  figure,
  fromSI,
  lookupUnit,
  MINUS,
  NO_VALUE,
  unitsOf,
  type Dimension,
  type UnitSystem,
} from '../units';
import { findKey } from '../vocabulary/keys';

/** Options of {@link figureText}. */
export interface FigureTextOptions {
  /** A difference (a temperature rise, a change of enthalpy): by the unit's scale, no datum. */
  difference?: boolean;
  /** A round bound of a range (−100 °C, 30 kPa): the zeros that end its decimals are not shown. */
  limit?: boolean;
}

/** One SI value as a message shows it in `system` (`84.556 kPa`, `12.264 psia`, `55.4 °F`). */
export function figureText(si: number, dimension: Dimension, system: UnitSystem, opts: FigureTextOptions = {}): string {
  // A temperature difference reads in K (SI) or °F (IP), never °C.
  const unit = dimension === 'temperature' && opts.difference ? lookupUnit(system === 'SI' ? 'K' : 'F') : undefined;
  const f = figure(si, dimension, system, { unit, difference: opts.difference });
  if (f.value === NO_VALUE && Number.isFinite(si)) {
    // Too large to show in the display unit (1e308 kg/kg is 1e311 g/kg): the figure as it is, in
    // the system's unit of scale 1 (kg/kg, lb/lb), in exponent form.
    const plain = unitsOf(dimension).find((u) => u.scale === 1 && u.system === system) ?? baseUnit(dimension);
    const n = fromSI(si, plain);
    // Four significant figures, trailing zeros dropped; rounding up at the top of the double range
    // (1.7977e308 → "1.798e+308") would read back as Infinity, so that text is kept as it is.
    const rounded = Number.isFinite(n) ? n.toPrecision(4) : undefined;
    const shown = rounded !== undefined && Number.isFinite(Number(rounded)) ? String(Number(rounded)) : rounded;
    const text = shown !== undefined ? shown.replace('-', MINUS) : NO_VALUE;
    return `${text} ${displaySymbol(plain)}`;
  }
  if (!opts.limit || !f.value.includes('.')) return f.text;
  const value = f.value.replace(/0+$/, '').replace(/\.$/, '');
  return f.unit ? `${value} ${f.unit}` : value;
}

/** A figure of an engine message in `system`. */
export function messageFigureText(f: MessageFigure, system: UnitSystem): string {
  return figureText(f.si, f.kind, system, { difference: f.difference, limit: f.limit });
}

/** A message with its figures in `system`. */
export function messageText(m: MessageText, system: UnitSystem): string {
  return renderText(m, (f) => messageFigureText(f, system));
}

/** An engine or equipment problem's message and fix with their figures in `system`. */
export function problemTexts(
  p: { message: string; fix: string; parts?: { message: MessageText; fix: MessageText } },
  system: UnitSystem,
): { message: string; fix: string } {
  if (!p.parts) return { message: p.message, fix: p.fix };
  return { message: messageText(p.parts.message, system), fix: messageText(p.parts.fix, system) };
}

/**
 * An example of a key for a message, in the note's unit system where the key table has one
 * (`q_total=334,000Btu/h` in an IP note, `q_total=98kW` in an SI one); the key's first example
 * otherwise (a ratio, or a key with examples in one system only).
 */
export function exampleIn(key: string, system: UnitSystem): string {
  const examples = findKey(key)?.examples ?? [];
  const fits = examples.find((e) => {
    const unit = /[0-9.,]([^0-9.,]+)$/.exec(e)?.[1];
    const def = unit ? lookupUnit(unit) : undefined;
    return def !== undefined && (def.system === system || def.system === 'both');
  });
  return fits ?? examples[0] ?? `${key}=…`;
}
