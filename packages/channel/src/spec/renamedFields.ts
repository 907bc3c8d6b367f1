/**
 * Fields the channel file had before the redesign of issue 13, and the field each value goes in
 * now: an unknown-field issue for an old name names it (a closest-name guess could point at a
 * neighbour). Relative tolerances are fractions now (`0.1 %` or `0.001`).
 */

/** Renamed keys of the common sections, by section: old key → the field it became. */
export const renamedCommonFields = {
  adc: { dataRateHertz: 'adc.filter.dataRateHertz' },
  tolerances: {
    completionOhms: 'tolerances.completionOhmsFraction',
    excitationVolts: 'tolerances.excitationVoltsFraction',
    referenceVolts: 'tolerances.referenceVoltsFraction',
    gain: 'tolerances.gainFraction',
    gaugeFactor: 'sensor.gaugeFactorToleranceFraction',
    ratedOutput: 'sensor.ratedOutputToleranceFraction',
    temperatureCelsius: 'tolerances.temperatureKelvin',
  },
} as const satisfies Readonly<Record<string, Readonly<Record<string, string>>>>;

/** Renamed keys of the sensor fragments, by sensor kind. */
export const renamedSensorFields: Readonly<Record<string, Readonly<Record<string, string>>>> = {
  transducer: {
    ratedOutput: 'sensor.ratedOutputVoltsPerVolt',
    capacityUnit: "sensor.capacity ('20 t')",
  },
};
