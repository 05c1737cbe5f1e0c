/**
 * Data model of the psychrometric chart. Everything here is SI (°C, kg/kg, Pa, J/kg, m³/kg) —
 * the display unit system only changes the axis scales and the labels, never the geometry.
 */
import type { UnitSystem } from '../units/types';

/** One plotted state (from a `state` or a `mix` statement). */
export interface ChartPoint {
  name: string;
  kind: 'state' | 'mix' | 'supply';
  /** Dry-bulb, °C. */
  db: number;
  /** Humidity ratio, kg/kg (for a fog state: the total water). */
  w: number;
  /** Enthalpy, J/kg dry air, when known (mixing lines use it; otherwise computed from db and w). */
  h?: number;
  /** Pressure of the state, Pa (when it differs from the chart's, the caption says so). */
  pressurePa?: number;
  /** True when the state lies in the fog region (more water than saturated air holds as vapour). */
  fog?: boolean;
  /** 1-based source line, when known. */
  line?: number;
  /**
   * True for a state drawn only because a statement of this chart uses it (a process's entering
   * state, a mix's stream, a supply's room) while it is defined in another case: drawn muted.
   */
  context?: boolean;
}

/**
 * A room's sensible heat ratio line, from a `supply` statement with loads: through the room state
 * and the supply state (air supplied anywhere on it takes up the room's loads in that ratio),
 * continued to the saturation curve.
 */
export interface ChartShrLine {
  /** The supply statement's name. */
  supply: string;
  /** The room state's name. */
  room: string;
  /** Room SHR Q_s / (Q_s + Q_l), or null when the loads have opposite signs. */
  shr: number | null;
  line?: number;
}

/** A mix: the named streams and the mixed state (also present as a point of kind `mix`). */
export interface ChartMix {
  name: string;
  streams: string[];
  line?: number;
}

/** A process drawn as an arrow from the entering to the leaving state. */
export interface ChartProcess {
  name: string;
  from: string;
  to: string;
  /** The kind of process in words (`cooling-dehumidifying`…), for the accessible description. */
  kind?: string | null;
  /** True when the evaluator flagged the process (an error or warning on its statement). */
  flagged?: boolean;
  line?: number;
  /**
   * A process that removes moisture: its apparatus dew point, where the line through its two
   * states meets saturation (dry-bulb °C, humidity ratio kg/kg at saturation).
   */
  adp?: { db: number; w: number };
}

/** A state that could not be plotted, or one plotted but physically impossible (fog). */
export interface ChartInfeasible {
  name: string;
  /** What is wrong, in the evaluator's words. */
  reason: string;
  /** True when the state has a position and is drawn (marked); false when it is only listed. */
  plotted: boolean;
  line?: number;
}

/** Everything {@link renderChartFromData} needs. */
export interface ChartData {
  /** Pressure the curves are drawn for, Pa. */
  pressurePa: number;
  /** Where that pressure came from, in words ("site line 3: elev=1600m", "default 101.325 kPa"). */
  pressureText?: string;
  /** Unit system of the axes and labels. */
  units: UnitSystem;
  points: ChartPoint[];
  mixes: ChartMix[];
  processes: ChartProcess[];
  infeasible: ChartInfeasible[];
  /** Room SHR lines of the supplies with loads (absent: none). */
  shrLines?: ChartShrLine[];
  /** Problems with how the note groups its charts (a bad `chart=` option), listed with the flagged items. */
  notes?: string[];
  /** Short title (the note's file name or first heading). */
  title?: string;
}

/** A dry-bulb × humidity-ratio window, SI. */
export interface ChartRange {
  /** °C */
  dbMin: number;
  /** °C */
  dbMax: number;
  /** kg/kg (normally 0) */
  wMin: number;
  /** kg/kg */
  wMax: number;
}

/** Which line families to draw (all on by default). */
export interface ChartFamilies {
  rh: boolean;
  wetBulb: boolean;
  enthalpy: boolean;
  volume: boolean;
}

/** Options of the renderer. */
export interface ChartOptions {
  /** Width of the SVG in CSS pixels (also its viewBox width). Default 960. */
  width?: number;
  /** Height of the plot area in CSS pixels. Default 520. */
  plotHeight?: number;
  /** A fixed window instead of the one fitted to the states. */
  range?: Partial<ChartRange>;
  /** Prefix for element ids (clip path, arrow marker), so several charts can share a page. Default `dmc`. */
  idPrefix?: string;
  /** Which line families to draw. */
  families?: Partial<ChartFamilies>;
  /** Title of the SVG (its `<title>`); default from the data. */
  title?: string;
  /** A CSP nonce for the SVG's `<style>` element (a webview with a nonce-only style policy). */
  styleNonce?: string;
}

/** A pixel position (CSS px, origin top-left of the SVG). */
export interface Pixel {
  x: number;
  y: number;
}

/** The geometry of one chart: the SVG size, the plot rectangle, and the SI window it shows. */
export interface ChartLayout {
  width: number;
  height: number;
  plot: { left: number; top: number; right: number; bottom: number };
  range: ChartRange;
  pressurePa: number;
  units: UnitSystem;
}
