/**
 * The meanings of the channel spec's fields, by path, for the field reference and the JSON
 * Schema (`schemaReference.ts`). Only those import this table; validation and conversion do not,
 * so an application that only converts does not carry it. A required field's meaning is not here
 * but on the field itself (`doc` in its definition), because the message for a missing one quotes
 * it; a test checks that each field has its meaning in exactly one of the two places.
 *
 * Paths are the field reference's: `bridge.wiring`, a sensor kind's fields under `sensor<kind>`,
 * the whole spec at `''`.
 */
import { outputQuantities, outputQuantityTable } from '../outputQuantities.js';
import { unitSymbols } from '../units/quantity.js';
import type { FieldDocs } from './schemaReference.js';

/** The units `output.unit` accepts, one group per dimension of the output quantities. */
const outputUnits = outputQuantities
  .filter(
    (q, i, all) =>
      all.findIndex((x) => outputQuantityTable[x].dimension === outputQuantityTable[q].dimension) === i,
  )
  .map((q) => unitSymbols(outputQuantityTable[q].dimension).join(', '))
  .join('; ');

/** The meanings of the built-in fields that do not carry their own (see the module comment). */
export const builtInFieldDocs: FieldDocs = {
  '': { doc: 'A measurement channel' },
  name: { doc: 'Name for reports and generated code' },
  'sensor<strain-gauge>': { doc: 'Strain gauges, in the arrangement of bridge.arrangement' },
  'sensor<strain-gauge>.gaugeOhms': { doc: 'Gauge resistance' },
  'sensor<strain-gauge>.gaugeFactorToleranceFraction': {
    doc: 'Gauge factor tolerance, relative (the lot’s data sheet), for the budget',
  },
  'sensor<strain-gauge>.transverseSensitivity': {
    doc: 'Transverse sensitivity Kt (measured with ν0 = 0.285)',
  },
  'sensor<strain-gauge>.gaugeFactorTemperatureCoefficientPerKelvin': {
    doc: 'Gauge-factor temperature coefficient β: GF(T) = GF·(1 + β·(T − T0))',
  },
  'sensor<strain-gauge>.gaugeFactorReferenceCelsius': { doc: 'Reference temperature T0 of the gauge factor' },
  'sensor<strain-gauge>.thermalOutput': {
    doc: "The gauge lot's thermal output (apparent strain) on the specimen",
  },
  'sensor<strain-gauge>.thermalOutput.gaugeFactor': {
    doc: 'Gauge-factor setting the curve was recorded with',
  },
  'sensor<transducer>': {
    doc: 'A bridge transducer with a certificate (load cell, pressure or torque transducer)',
  },
  'sensor<transducer>.ratedQuantity': {
    doc: 'What the capacity is',
    defaultText: "from capacity's unit; for a plain number, the output quantity",
  },
  'sensor<transducer>.ratedOutputToleranceFraction': {
    doc: 'Rated output tolerance, relative (certificate), for the budget',
  },
  'sensor<transducer>.zeroBalanceVoltsPerVolt': { doc: 'Zero balance (output at no load)' },
  'sensor<transducer>.inputOhms': { doc: 'Input (excitation) resistance' },
  'sensor<transducer>.outputOhms': { doc: 'Output resistance' },
  'sensor<transducer>.calibrationGravityMetersPerSecondSquared': {
    doc: "Gravity where the certificate's weights acted",
  },
  'sensor<transducer>.localGravityMetersPerSecondSquared': {
    doc: 'Gravity where the transducer is used (mass from force)',
  },
  'sensor<transducer>.zeroTemperatureCoefficientPerKelvin': {
    doc: 'Zero shift per kelvin, as a fraction of the rated output (data sheet: "0.02 % RO/10 K" is 2e-5)',
  },
  'sensor<transducer>.spanTemperatureCoefficientPerKelvin': {
    doc: 'Span (rated output) change per kelvin, relative',
  },
  'sensor<transducer>.certificateCelsius': {
    doc: "Temperature at which the certificate's rated output holds",
  },
  'sensor<rtd>': { doc: 'A platinum RTD (IEC 60751) in arm 1 of a quarter bridge' },
  'sensor<rtd>.r0Ohms': { doc: 'Resistance at 0 °C' },
  'sensor<rtd>.a': { doc: 'Callendar–Van Dusen A, 1/°C' },
  'sensor<rtd>.b': { doc: 'Callendar–Van Dusen B, 1/°C²' },
  'sensor<rtd>.c': { doc: 'Callendar–Van Dusen C (below 0 °C), 1/°C⁴' },
  'sensor<rtd>.toleranceClass': { doc: 'IEC 60751 tolerance class, for the budget' },
  'sensor<rtd>.element': { doc: 'Element construction (sets the class’s validity range)' },
  'sensor<thermistor>': { doc: 'An NTC thermistor (beta or Steinhart–Hart) in arm 1 of a quarter bridge' },
  'sensor<thermistor>.referenceCelsius': { doc: 'Reference temperature t0' },
  'sensor<thermistor>.betaKelvin': {
    doc: 'Beta constant B (e.g. B25/85): R = R0·exp(B·(1/T − 1/T0)); give this or steinhartHart',
  },
  'sensor<thermistor>.steinhartHart': {
    doc: 'Steinhart–Hart coefficients: 1/T = a + b·ln R + c·(ln R)³; give this or betaKelvin',
  },
  'sensor<thermistor>.rangeCelsius': {
    doc: 'Temperatures over which the model holds and the channel converts',
    defaultText: '[-55, 150] (a common NTC rating)',
  },
  'sensor<thermistor>.referenceOhmsToleranceFraction': {
    doc: 'Resistance tolerance at t0, relative (the element reads as R·(1 + δ)), for the budget',
  },
  'sensor<thermistor>.betaToleranceFraction': {
    doc: 'Beta tolerance, relative, for the budget (beta model)',
  },
  'sensor<thermistor>.dissipationConstantWattsPerKelvin': {
    doc: 'Dissipation constant δ (power per kelvin of self-heating, in the medium); the map corrects self-heating when given',
  },
  'sensor<thermistor>.dissipationToleranceFraction': {
    doc: 'Dissipation constant tolerance, relative, for the budget',
  },
  bridge: { doc: 'Bridge arrangement, completion and cable' },
  'bridge.arrangement': {
    doc: "Strain-gauge arrangement (the bridge package's table); a single element sits in arm 1 of a quarter bridge",
    defaultText: "'quarter' (strain gauges, RTDs, thermistors); absent for transducers",
  },
  'bridge.poissonRatio': {
    doc: 'Poisson ratio of the specimen (Poisson arrangements, transverse sensitivity, shear modulus from E)',
  },
  'bridge.completionOhms': {
    doc: 'Completion resistors',
    defaultText: "the sensor's nominal resistance (absent for transducers)",
  },
  'bridge.wiring': {
    doc: 'Lead wiring',
    defaultText:
      "'three-wire' where the arrangement allows it, else 'four-wire' ('six-wire' with excitation.remoteSense), else the arrangement's one wiring",
  },
  'bridge.ohmsPerLead': { doc: 'Resistance of one lead conductor', defaultText: '0, or from cable' },
  'bridge.cable': { doc: 'Copper cable from which the lead resistance is computed (IEC 60028)' },
  'bridge.cable.awg': { doc: 'AWG size of each conductor (ASTM B258)' },
  'bridge.cable.diameterMeters': { doc: 'Conductor diameter (instead of awg)' },
  'bridge.cable.conductorsPerLead': { doc: 'Conductors in parallel per lead' },
  'excitation.sourceOhms': { doc: 'Internal resistance of the source (absolute reference only)' },
  'excitation.remoteSense': {
    doc: 'Excitation sensed at the bridge (six-wire)',
    defaultText: "true when bridge.wiring is 'six-wire'",
  },
  amplifier: { doc: 'Amplifier (instrumentation amplifier or the converter’s PGA)' },
  'amplifier.gain': { doc: 'Total gain from bridge to quantizer' },
  'amplifier.inputVoltageNoiseVoltsPerRootHz': { doc: 'Input voltage noise density (white)' },
  'amplifier.voltageCornerHertz': { doc: '1/f corner of the voltage noise' },
  'amplifier.currentNoiseAmpsPerRootHz': { doc: 'Input current noise density (white)' },
  'amplifier.currentCornerHertz': { doc: '1/f corner of the current noise' },
  'amplifier.secondStageGain': { doc: 'Gain of the second (difference) stage' },
  'amplifier.outputReferenceVolts': { doc: 'Output reference voltage' },
  'amplifier.excitationLowVolts': { doc: 'Potential of E− relative to the amplifier ground' },
  'amplifier.limits': { doc: 'Amplifier limits for the headroom check' },
  'amplifier.limits.inputCommonModeVolts': { doc: 'Input common-mode range' },
  'amplifier.limits.inputDifferentialVolts': { doc: 'Largest differential input magnitude' },
  'amplifier.limits.firstStageVolts': { doc: 'First-stage output range' },
  'amplifier.limits.outputVolts': { doc: 'Output swing' },
  'adc.bipolar': { doc: "Two's complement ±full scale" },
  'adc.ratiometric': { doc: 'The reference is the excitation' },
  'adc.filter': { doc: "The converter's digital filter and data rate" },
  'adc.filter.kind': { doc: 'Filter kind (a sinc filter, as the chain package names it)' },
  'adc.filter.order': { doc: 'Order of the sinc filter' },
  'adc.filter.dataRateHertz': { doc: 'Output data rate' },
  'adc.noiseRmsVolts': {
    doc: "The converter's own input-referred rms noise at this gain and rate (default: ideal quantization)",
  },
  zero: { doc: 'Zero reading, for the exact two-reading method' },
  polarity: { doc: "'inverted' when the signal leads are swapped (tension reads negative codes)" },
  environment: { doc: 'Temperatures of the installation' },
  'environment.temperatureCelsius': { doc: 'Sensor temperature during the measurement' },
  'environment.zeroTemperatureCelsius': {
    doc: 'Sensor temperature when the zero was taken',
    defaultText: 'temperatureCelsius',
  },
  'environment.cableTemperatureCelsius': {
    doc: 'Cable temperature (for its resistance)',
    defaultText: 'temperatureCelsius',
  },
  'environment.rangeCelsius': {
    doc: 'Temperature range the budget covers',
    defaultText: '[temperatureCelsius, temperatureCelsius]',
  },
  tolerances: { doc: 'Tolerance half-widths (rectangular limits) for the budget' },
  'tolerances.completionOhmsFraction': { doc: 'Completion resistors, relative' },
  'tolerances.ohmsPerLead': { doc: 'Lead resistance (absolute)' },
  'tolerances.excitationVoltsFraction': { doc: 'Excitation EMF, relative (absolute reference only)' },
  'tolerances.gainFraction': { doc: 'Amplifier gain, relative' },
  'tolerances.referenceVoltsFraction': { doc: 'Converter reference, relative (absolute reference only)' },
  'tolerances.offsetVolts': { doc: 'Input-referred offset left after zeroing' },
  'tolerances.temperatureKelvin': { doc: 'Sensor temperature used in corrections' },
  'tolerances.coverageProbability': { doc: 'Coverage probability of the expanded uncertainty' },
  'output.unit': {
    doc: `Unit of the channel's values, of range and of firmwareResolution: ${outputUnits}`,
    defaultText: 'the SI unit of the quantity (m/m, Pa, N, kg, N·m, °C, V/V)',
  },
  'output.range': {
    doc: 'Span of interest, in the output unit',
    defaultText: "the sensor's usual span, narrowed to what the channel can read",
  },
  'output.firmwareResolution': { doc: 'Output LSB of fixed-point firmware constants, in the output unit' },
  'output.modulusPascals': {
    doc: "Young's modulus E of the specimen (stress, force, bending moment; shear modulus with poissonRatio)",
  },
  'output.shearModulusPascals': {
    doc: 'Shear modulus G of the specimen (shear stress, torque); default E/(2(1 + ν))',
  },
  'output.areaSquareMeters': { doc: 'Cross-section of an axial member (force)' },
  'output.sectionModulusCubicMeters': {
    doc: 'Elastic section modulus W = I/c at the gauges (bending moment; force at a lever arm)',
  },
  'output.leverArmMeters': {
    doc: 'Distance from the line of the force to the gauged section (force from a bending bridge)',
  },
  'output.shaftDiameterMeters': { doc: 'Outside diameter of the shaft at the gauges (torque)' },
  'output.shaftBoreMeters': { doc: 'Bore of a hollow shaft (torque)', defaultText: '0 (solid)' },
  spanCorrection: { doc: 'Span correction from a shunt calibration (written by `bridgework shunt-apply`)' },
  'spanCorrection.factorStandardUncertainty': {
    doc: 'Standard uncertainty of the factor (from the readings’ scatter and the shunt’s tolerance); replaces the gain tolerance in the budget',
  },
  'spanCorrection.shuntOhms': { doc: 'The shunt resistor used' },
  'spanCorrection.arm': { doc: 'The bridge arm it was across (1–4)' },
  'spanCorrection.placement': {
    doc: 'Where it was connected: across the gauge, or at the instrument end of the cable',
  },
  'spanCorrection.expectedStepCodes': { doc: 'The step the exact network predicts, in converter codes' },
  'spanCorrection.measuredStepCodes': {
    doc: 'The step measured (with shunt minus without), in converter codes',
  },
  'spanCorrection.readings': { doc: 'Readings averaged in each state (without and with the shunt)' },
  'spanCorrection.date': { doc: 'When it was measured (ISO 8601 date or date and time)' },
  'spanCorrection.note': { doc: 'Who, with what, why (free text)' },
  calibration: {
    doc: 'Calibration against reference loads (written by `bridgework fit-calibration`): the channel converts through it',
  },
  'calibration.covariance': { doc: 'Covariance of the coefficients, row by row ((degree + 1)² numbers)' },
  'calibration.extrapolationFraction': {
    doc: 'How far past the reference loads the channel converts, as a fraction of their span on each side',
  },
  'calibration.residualStandardDeviation': { doc: 'Residual standard deviation of the fit, V/V' },
  'calibration.points': { doc: 'Number of calibration points' },
  'calibration.pointsFile': { doc: 'The points file (as given to the command)' },
  'calibration.pointsSha256': { doc: 'SHA-256 of the points file’s bytes' },
  'calibration.date': { doc: 'When it was measured (ISO 8601 date or date and time)' },
  'calibration.note': { doc: 'Who, with what, why (free text)' },
};
