/**
 * The units a person may write, by dimension: one table, read by the parser, the formatter and
 * the generated docs. Factors are exact decimals where the unit is defined by one (`lbf` is
 * exactly 4.4482216152605 N, `lb` 0.45359237 kg, `in` 0.0254 m); `psi` and `ksi` have no finite
 * decimal factor and carry the double nearest it.
 */

/** What a quantity measures; each dimension has one unit in which the channel computes (its `si`). */
export type Dimension =
  | 'resistance'
  | 'voltage'
  | 'current'
  | 'power'
  | 'length'
  | 'area'
  | 'volume'
  | 'acceleration'
  | 'pressure'
  | 'force'
  | 'mass'
  | 'torque'
  | 'frequency'
  | 'time'
  | 'temperature'
  | 'temperature-difference'
  | 'strain'
  | 'ratio'
  | 'fraction'
  | 'per-kelvin'
  | 'voltage-density'
  | 'current-density'
  | 'thermal-conductance'
  | 'dimensionless';

/** One unit: its symbol (as reports print it), the other spellings accepted, its factor to the dimension's unit. */
export interface UnitDefinition {
  /** The symbol reports print (`'kN'`, `'µε'`, `'°C'`). */
  readonly symbol: string;
  /** Other spellings accepted in input (`'kohm'`, `'ue'`). */
  readonly aliases: readonly string[];
  /**
   * Factor to the dimension's unit: an exact decimal as text (`'1e3'`, `'4.4482216152605'`), or
   * a double where no finite decimal exists (`psi`). Temperatures use `offset` too.
   */
  readonly factor: string | number;
}

/** A dimension: its unit, how to name it in messages, an example, and every unit accepted. */
export interface DimensionDefinition {
  /** The unit the channel computes in (SI; °C for temperatures, the trade's custom). */
  readonly si: string;
  /** The dimension in words, with its article (`'a resistance'`). */
  readonly what: string;
  /** A typical value with a unit, for messages (`'350 Ω'`). */
  readonly example: string;
  /** Every unit, the `si` one first. */
  readonly units: readonly UnitDefinition[];
}

const u = (symbol: string, factor: string | number, ...aliases: string[]): UnitDefinition => ({
  symbol,
  aliases,
  factor,
});

/** Every dimension and its units. */
export const dimensionTable: Readonly<Record<Dimension, DimensionDefinition>> = {
  resistance: {
    si: 'Ω',
    what: 'a resistance',
    example: '350 Ω',
    units: [
      u('Ω', '1', 'ohm', 'ohms', 'Ohm'),
      u('mΩ', '1e-3', 'mohm'),
      u('kΩ', '1e3', 'kohm', 'kOhm'),
      u('MΩ', '1e6', 'Mohm', 'MOhm'),
      u('GΩ', '1e9', 'Gohm'),
    ],
  },
  voltage: {
    si: 'V',
    what: 'a voltage',
    example: '5 V',
    units: [u('V', '1'), u('mV', '1e-3'), u('µV', '1e-6', 'uV'), u('nV', '1e-9'), u('kV', '1e3')],
  },
  current: {
    si: 'A',
    what: 'a current',
    example: '10 mA',
    units: [u('A', '1'), u('mA', '1e-3'), u('µA', '1e-6', 'uA'), u('nA', '1e-9'), u('pA', '1e-12')],
  },
  power: {
    si: 'W',
    what: 'a power',
    example: '0.25 W',
    units: [u('W', '1'), u('mW', '1e-3'), u('µW', '1e-6', 'uW'), u('kW', '1e3')],
  },
  length: {
    si: 'm',
    what: 'a length',
    example: '12 m',
    units: [
      u('m', '1'),
      u('mm', '1e-3'),
      u('cm', '1e-2'),
      u('km', '1e3'),
      u('µm', '1e-6', 'um'),
      u('in', '0.0254'),
      u('ft', '0.3048'),
    ],
  },
  area: {
    si: 'm²',
    what: 'an area',
    example: '561 mm²',
    units: [
      u('m²', '1', 'm^2'),
      u('mm²', '1e-6', 'mm^2'),
      u('cm²', '1e-4', 'cm^2'),
      u('in²', '0.00064516', 'in^2'),
    ],
  },
  volume: {
    si: 'm³',
    what: 'a volume (a section modulus)',
    example: '2.5 cm³',
    units: [
      u('m³', '1', 'm^3'),
      u('mm³', '1e-9', 'mm^3'),
      u('cm³', '1e-6', 'cm^3'),
      u('in³', '0.000016387064', 'in^3'),
    ],
  },
  acceleration: {
    si: 'm/s²',
    what: 'an acceleration',
    example: '9.8127 m/s²',
    units: [u('m/s²', '1', 'm/s^2'), u('gn', '9.80665')],
  },
  pressure: {
    si: 'Pa',
    what: 'a pressure or stress',
    example: '205 GPa',
    units: [
      u('Pa', '1', 'N/m²', 'N/m^2'),
      u('hPa', '1e2'),
      u('kPa', '1e3', 'kN/m²', 'kN/m^2'),
      u('MPa', '1e6', 'N/mm²', 'N/mm^2'),
      u('GPa', '1e9', 'kN/mm²', 'kN/mm^2'),
      u('mbar', '1e2'),
      u('bar', '1e5'),
      u('psi', 6894.757293168362, 'lbf/in²', 'lbf/in^2'),
      u('ksi', 6894757.293168361),
    ],
  },
  force: {
    si: 'N',
    what: 'a force',
    example: '84 kN',
    units: [
      u('N', '1'),
      u('mN', '1e-3'),
      u('kN', '1e3'),
      u('MN', '1e6'),
      u('lbf', '4.4482216152605'),
      u('kip', '4448.2216152605', 'klbf'),
      u('kgf', '9.80665'),
    ],
  },
  mass: {
    si: 'kg',
    what: 'a mass',
    example: '500 kg',
    units: [u('kg', '1'), u('g', '1e-3'), u('mg', '1e-6'), u('t', '1e3'), u('lb', '0.45359237', 'lbm')],
  },
  torque: {
    si: 'N·m',
    what: 'a torque or moment',
    example: '250 N·m',
    units: [
      u('N·m', '1', 'N*m', 'Nm', 'N m'),
      u('N·mm', '1e-3', 'N*mm', 'Nmm', 'N mm'),
      u('kN·m', '1e3', 'kN*m', 'kNm', 'kN m'),
      u('MN·m', '1e6', 'MN*m', 'MNm', 'MN m'),
      u('lbf·ft', '1.3558179483314004', 'lbf*ft', 'lbf ft', 'ft·lbf', 'ft*lbf', 'ft lbf'),
      u('lbf·in', '0.1129848290276167', 'lbf*in', 'lbf in', 'in·lbf', 'in*lbf', 'in lbf'),
    ],
  },
  frequency: {
    si: 'Hz',
    what: 'a frequency',
    example: '10 Hz',
    units: [u('Hz', '1'), u('mHz', '1e-3'), u('kHz', '1e3'), u('MHz', '1e6')],
  },
  time: {
    si: 's',
    what: 'a time',
    example: '100 ms',
    units: [u('s', '1'), u('ms', '1e-3'), u('µs', '1e-6', 'us'), u('min', '60'), u('h', '3600')],
  },
  temperature: {
    si: '°C',
    what: 'a temperature',
    example: '25 °C',
    // Factors are per degree; the offsets are in TEMPERATURE_OFFSETS (°C = K − 273.15, °C = (°F − 32)·5/9).
    units: [u('°C', '1', 'degC', 'deg C', 'Celsius'), u('K', '1', 'kelvin'), u('°F', 5 / 9, 'degF', 'deg F')],
  },
  'temperature-difference': {
    si: 'K',
    what: 'a temperature difference',
    example: '2 K',
    units: [u('K', '1', '°C', 'degC'), u('mK', '1e-3'), u('°F', 5 / 9, 'degF')],
  },
  strain: {
    si: 'm/m',
    what: 'a strain',
    example: '1200 µε',
    units: [
      u('m/m', '1', 'mm/mm'),
      u('µε', '1e-6', 'ue', 'με', 'µm/m', 'um/m', 'microstrain'),
      u('mε', '1e-3', 'me', 'mm/m'),
      u('%', '1e-2'),
    ],
  },
  ratio: {
    si: 'V/V',
    what: 'a bridge output ratio',
    example: '2 mV/V',
    units: [u('V/V', '1'), u('mV/V', '1e-3'), u('µV/V', '1e-6', 'uV/V')],
  },
  fraction: {
    si: '',
    what: 'a fraction',
    example: '0.5 %',
    units: [u('', '1'), u('%', '1e-2'), u('‰', '1e-3'), u('ppm', '1e-6')],
  },
  'per-kelvin': {
    si: '1/K',
    what: 'a temperature coefficient',
    example: '20 ppm/K',
    units: [
      u('1/K', '1', '/K', '1/°C', '/°C', 'K^-1'),
      u('%/K', '1e-2', '%/°C'),
      u('ppm/K', '1e-6', 'ppm/°C'),
    ],
  },
  'voltage-density': {
    si: 'V/√Hz',
    what: 'a voltage noise density',
    example: '8 nV/√Hz',
    units: [
      u('V/√Hz', '1', 'V/rtHz', 'V/sqrt(Hz)'),
      u('µV/√Hz', '1e-6', 'uV/√Hz', 'uV/rtHz', 'µV/rtHz', 'uV/sqrt(Hz)'),
      u('nV/√Hz', '1e-9', 'nV/rtHz', 'nV/sqrt(Hz)'),
    ],
  },
  'current-density': {
    si: 'A/√Hz',
    what: 'a current noise density',
    example: '0.2 pA/√Hz',
    units: [
      u('A/√Hz', '1', 'A/rtHz', 'A/sqrt(Hz)'),
      u('nA/√Hz', '1e-9', 'nA/rtHz', 'nA/sqrt(Hz)'),
      u('pA/√Hz', '1e-12', 'pA/rtHz', 'pA/sqrt(Hz)'),
      u('fA/√Hz', '1e-15', 'fA/rtHz', 'fA/sqrt(Hz)'),
    ],
  },
  'thermal-conductance': {
    si: 'W/K',
    what: 'a dissipation constant',
    example: '1.5 mW/K',
    units: [u('W/K', '1', 'W/°C'), u('mW/K', '1e-3', 'mW/°C')],
  },
  dimensionless: {
    si: '',
    what: 'a plain number',
    example: '0.3',
    units: [u('', '1')],
  },
};

/** Every dimension, in the order of the table. */
export const dimensions: readonly Dimension[] = Object.keys(dimensionTable) as Dimension[];
