/**
 * Messages with figures in them. The engine computes in SI and its messages read in SI (`text`),
 * but a note in IP units must show the same figures in IP: so every figure of a message is kept
 * as a number with what it measures (a {@link MessageFigure}) beside the words, and a caller that
 * knows the reader's unit system renders the parts with its own formatter (the evaluator does so
 * with the units layer's `figure`). Build parts with the {@link msg} tag:
 *
 *     msg`The wet-bulb ${T(wb)} is above the dry-bulb ${T(db)}.`
 *
 * A figure interpolated into an untagged template still reads (its `toString` is the SI text), so
 * a forgotten tag degrades to an SI message, never to "[object Object]".
 */
import { fmtH, fmtNum, fmtPa, fmtRh, fmtT, fmtW } from './format';

/**
 * What a figure measures: the names of the units layer's dimensions (kept here as strings, since
 * the engine does not depend on the units layer).
 */
export type FigureKind =
  | 'temperature'
  | 'pressure'
  | 'humidityRatio'
  | 'enthalpy'
  | 'fraction'
  | 'length'
  | 'massFlow'
  | 'volumeFlow'
  | 'power';

/**
 * A figure in a message: an SI value and what it measures; a difference converts by scale alone;
 * a limit (a round bound such as −100 °C) is shown without the trailing zeros of its decimals.
 */
export class MessageFigure {
  constructor(
    readonly si: number,
    readonly kind: FigureKind,
    readonly difference = false,
    readonly limit = false,
  ) {}

  /** The SI text of the engine's own messages (`24.05 °C`, `84.556 kPa`, `9.3 g/kg`). */
  toString(): string {
    return siFigureText(this);
  }
}

/** Words and figures, in reading order. */
export type MessageParts = readonly (string | MessageFigure)[];

/** A message as plain SI text, or as parts. */
export type MessageText = string | MessageParts;

/** Tag of a template literal: keeps each interpolated {@link MessageFigure}, joins everything else as text. */
export function msg(strings: TemplateStringsArray, ...values: unknown[]): MessageParts {
  const out: (string | MessageFigure)[] = [];
  let text = '';
  strings.forEach((s, i) => {
    text += s;
    if (i >= values.length) return;
    const v = values[i];
    if (v instanceof MessageFigure) {
      if (text) out.push(text);
      out.push(v);
      text = '';
    } else if (Array.isArray(v) && v.every((x) => typeof x === 'string' || x instanceof MessageFigure)) {
      // Nested parts (a phrase built elsewhere).
      for (const x of v as MessageParts) {
        if (typeof x === 'string') text += x;
        else {
          if (text) out.push(text);
          out.push(x);
          text = '';
        }
      }
    } else text += String(v);
  });
  if (text) out.push(text);
  return out;
}

/** A temperature, °C. */
export const T = (tC: number): MessageFigure => new MessageFigure(tC, 'temperature');
/** A temperature that is a bound of a range (−100 °C, 200 °C), °C. */
export const TL = (tC: number): MessageFigure => new MessageFigure(tC, 'temperature', false, true);
/** A pressure that is a bound of a range, Pa. */
export const PL = (pa: number): MessageFigure => new MessageFigure(pa, 'pressure', false, true);
/** A temperature difference, K. */
export const DT = (k: number): MessageFigure => new MessageFigure(k, 'temperature', true);
/** A temperature difference that is a round figure (10 K), K. */
export const DTL = (k: number): MessageFigure => new MessageFigure(k, 'temperature', true, true);
/** A pressure, Pa. */
export const P = (pa: number): MessageFigure => new MessageFigure(pa, 'pressure');
/** A humidity ratio, kg/kg. */
export const W = (w: number): MessageFigure => new MessageFigure(w, 'humidityRatio');
/** A difference of humidity ratio, kg/kg. */
export const DW = (w: number): MessageFigure => new MessageFigure(w, 'humidityRatio', true);
/** An enthalpy, J/kg (dry air 0 at 0 °C). */
export const H = (h: number): MessageFigure => new MessageFigure(h, 'enthalpy');
/** A difference of enthalpy, J/kg. */
export const DH = (h: number): MessageFigure => new MessageFigure(h, 'enthalpy', true);
/** A fraction (relative humidity, efficiency), 0…1. */
export const RH = (x: number): MessageFigure => new MessageFigure(x, 'fraction');
/** A length (elevation), m. */
export const Z = (m: number): MessageFigure => new MessageFigure(m, 'length');
/** An elevation that is a bound of a range, m. */
export const ZL = (m: number): MessageFigure => new MessageFigure(m, 'length', false, true);
/** A dry-air mass flow, kg/s. */
export const M = (kgs: number): MessageFigure => new MessageFigure(kgs, 'massFlow');
/** A volume flow, m³/s. */
export const V = (m3s: number): MessageFigure => new MessageFigure(m3s, 'volumeFlow');
/** A heat rate, W. */
export const Q = (w: number): MessageFigure => new MessageFigure(w, 'power', true);

/** The SI text of one figure, as the engine's messages have always written it. */
function siFigureText(f: MessageFigure): string {
  const x = f.si;
  switch (f.kind) {
    case 'temperature':
      return f.difference ? `${fmtNum(x, 3)} K` : fmtT(x);
    case 'pressure':
      return fmtPa(x);
    case 'humidityRatio':
      return fmtW(x);
    case 'enthalpy':
      return f.difference ? `${fmtNum(x / 1000, 3)} kJ/kg` : fmtH(x);
    case 'fraction':
      return fmtRh(x);
    case 'length':
      return `${fmtNum(x, 6)} m`;
    case 'massFlow':
      return `${fmtNum(x, 4)} kg/s`;
    case 'volumeFlow':
      return `${fmtNum(x, 4)} m³/s`;
    case 'power':
      return `${fmtNum(x / 1000, 4)} kW`;
  }
}

/** The text of a message with every figure in SI (the engine's own wording). */
export function siText(m: MessageText): string {
  if (typeof m === 'string') return m;
  return m.map((x) => (typeof x === 'string' ? x : siFigureText(x))).join('');
}

/** The text of a message with each figure written by `figure` (another unit system, another precision). */
export function renderText(m: MessageText, figure: (f: MessageFigure) => string): string {
  if (typeof m === 'string') return m;
  return m.map((x) => (typeof x === 'string' ? x : figure(x))).join('');
}

/** `parts` when the message has figures, undefined for plain text. */
export function partsOf(m: MessageText): MessageParts | undefined {
  return typeof m === 'string' ? undefined : m;
}

/** The message without its final full stop (to be continued in a longer sentence). */
export function withoutFinalStop(m: MessageText): MessageText {
  if (typeof m === 'string') return m.replace(/\.$/, '');
  const last = m[m.length - 1];
  if (typeof last !== 'string') return m;
  return [...m.slice(0, -1), last.replace(/\.$/, '')];
}

/** A problem's message and fix as parts when it has them, as its SI text otherwise. */
export function problemParts(p: { message: string; fix: string; parts?: { message: MessageText; fix: MessageText } }): {
  message: MessageText;
  fix: MessageText;
} {
  return p.parts ?? { message: p.message, fix: p.fix };
}
