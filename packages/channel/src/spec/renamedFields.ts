/**
 * Fields the channel file had before the redesign of issue 13, and where each is written now: an
 * unknown-field issue for an old name says where its value goes (a closest-name guess could point
 * at a neighbour: `tolerances.gain` is not `tolerances.gainFraction`'s value in the same form).
 */

/** Renamed keys of the common sections, by section (keys as written in the old files). */
export const renamedCommonFields = {
  adc: {
    dataRateHertz:
      'write it as adc.filter.dataRateHertz (the filter and its data rate are one section: filter: { order: 3, dataRateHertz: 10 Hz })',
  },
  tolerances: {
    completionOhms: 'write it as tolerances.completionOhmsFraction (a fraction: 0.001 or 0.1 %)',
    excitationVolts: 'write it as tolerances.excitationVoltsFraction (a fraction: 0.001 or 0.1 %)',
    referenceVolts: 'write it as tolerances.referenceVoltsFraction (a fraction: 0.001 or 0.1 %)',
    gain: 'write it as tolerances.gainFraction (a fraction: 0.001 or 0.1 %)',
    gaugeFactor: "write it as sensor.gaugeFactorToleranceFraction (the sensor's own tolerance, a fraction)",
    ratedOutput: "write it as sensor.ratedOutputToleranceFraction (the certificate's tolerance, a fraction)",
    temperatureCelsius: 'write it as tolerances.temperatureKelvin (a temperature difference, in K)',
  },
} as const satisfies Readonly<Record<string, Readonly<Record<string, string>>>>;

/** Renamed keys of the sensor fragments, by sensor kind. */
export const renamedSensorFields: Readonly<Record<string, Readonly<Record<string, string>>>> = {
  transducer: {
    ratedOutput: "write it as sensor.ratedOutputVoltsPerVolt (with its unit: '2 mV/V')",
    capacityUnit: "write the unit in sensor.capacity itself ('20 t', '500 kN', '10 bar')",
  },
};
