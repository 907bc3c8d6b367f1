import { describe, expect, it } from 'vitest';
import {
  BOLTZMANN_JOULES_PER_KELVIN,
  STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED,
  ZERO_CELSIUS_KELVIN,
  celsiusFromKelvin,
  kelvinFromCelsius,
} from '@bridgework/core';

describe('physical constants', () => {
  it('are the exact defined values', () => {
    // SI Brochure, 9th edition (2019), Table 1: k = 1.380649e-23 J/K exactly.
    expect(BOLTZMANN_JOULES_PER_KELVIN).toBe(1.380649e-23);
    // 3rd CGPM (1901): gn = 9.80665 m/s² exactly.
    expect(STANDARD_GRAVITY_METERS_PER_SECOND_SQUARED).toBe(9.80665);
    // SI Brochure, 9th edition, 2.3.1: t/°C = T/K − 273.15.
    expect(ZERO_CELSIUS_KELVIN).toBe(273.15);
  });

  it('converts Celsius and kelvin both ways', () => {
    expect(kelvinFromCelsius(25)).toBeNear(298.15, { ulps: 0 });
    expect(celsiusFromKelvin(373.15)).toBeNear(100, { ulps: 1 });
    expect(kelvinFromCelsius(-273.15)).toBe(0);
  });
});
