/**
 * Public types of the units module. Every quantity converts to one SI base per dimension,
 * the base the physics engine uses:
 *
 * | dimension        | SI base                                   |
 * |------------------|-------------------------------------------|
 * | temperature      | °C                                        |
 * | pressure         | Pa                                        |
 * | humidityRatio    | kg/kg                                     |
 * | enthalpy         | J/kg dry air, datum dry air 0 at 0 °C     |
 * | specificVolume   | m³/kg dry air                             |
 * | length           | m                                         |
 * | massFlow         | kg/s                                      |
 * | volumeFlow       | m³/s                                      |
 * | power            | W                                         |
 * | fraction         | 1 (so 50 % is 0.5)                        |
 * | density          | kg/m³                                     |
 */
export type Dimension =
  | 'temperature'
  | 'pressure'
  | 'humidityRatio'
  | 'enthalpy'
  | 'specificVolume'
  | 'length'
  | 'massFlow'
  | 'volumeFlow'
  | 'power'
  | 'fraction'
  | 'density';

/** A unit system for showing results. */
export type UnitSystem = 'SI' | 'IP';

/** One unit: how it is written, what it measures, and how it converts to the SI base. */
export interface UnitDef {
  /** The canonical symbol as the notation writes it (`C`, `kPa`, `g/kg`, `Btu/lb`…). */
  symbol: string;
  /** Other accepted spellings (`°C`, `degC`…), case-sensitive. */
  aliases: readonly string[];
  dimension: Dimension;
  /** The system the unit belongs to ('both' for %, Pa-free ones like `atm`). */
  system: UnitSystem | 'both';
  /** One-line description for hovers and completion (`degree Celsius`). */
  title: string;
  /**
   * Affine conversion to the SI base: `si = value * scale + offset`. The offset is non-zero
   * only for temperatures (°F, K, R) and for enthalpy in Btu/lb, whose dry-air datum is 0 °F
   * rather than 0 °C. A difference (a tolerance) converts with `scale` alone.
   */
  scale: number;
  offset: number;
}
