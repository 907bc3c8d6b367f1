/**
 * Issue 15: errors found while building a channel's model, or its front-end budget, name the
 * channel-file field the user can change (never the channel as a whole, never a component's
 * internal parameter).
 */
import { describe, expect, it } from 'vitest';
import { BridgeworkError } from '@bridgework/core';
import { channelBudget, createChannel, validateChannelSpec, type ChannelSpec } from '@bridgework/channel';
import { frontEndField, inChannelTerms } from '../src/budget/frontEndErrors.js';

const strain: ChannelSpec = {
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.1, gaugeOhms: 350 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.2 },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true },
  output: { quantity: 'strain', unit: 'µε', range: [-1000, 1000] },
};
const rtd: ChannelSpec = {
  sensor: { kind: 'rtd', r0Ohms: 100 },
  bridge: { wiring: 'three-wire', ohmsPerLead: 0.5 },
  excitation: { volts: 1 },
  amplifier: { gain: 4 },
  adc: { bits: 24, referenceVolts: 1, ratiometric: true },
  output: { quantity: 'temperature', range: [0, 100] },
};
const load: ChannelSpec = {
  sensor: { kind: 'transducer', capacity: '20 t', ratedOutputVoltsPerVolt: '2 mV/V' },
  excitation: { volts: 5 },
  amplifier: { gain: 128 },
  adc: { bits: 24, referenceVolts: 2.5 },
  output: { quantity: 'mass', unit: 't', range: [0, 20] },
};
const ntc: ChannelSpec = {
  sensor: { kind: 'thermistor', referenceOhms: 10_000, betaKelvin: 3950 },
  excitation: { volts: 2.5 },
  amplifier: { gain: 1 },
  adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
  output: { quantity: 'temperature', range: [0, 50] },
};

/** The paths of the issues a spec is refused with. */
function issuePaths(spec: unknown): string[] {
  try {
    createChannel(spec as ChannelSpec);
  } catch (e) {
    if (e instanceof BridgeworkError && e.code === 'invalid-spec') return e.issues.map((i) => i.path);
    throw e;
  }
  return [];
}

const edit = (spec: ChannelSpec, section: string, fields: Record<string, unknown>): unknown => {
  const s = structuredClone(spec) as unknown as Record<string, Record<string, unknown>>;
  s[section] = { ...s[section], ...fields };
  return s;
};

describe('model-build errors name the field the user can change (issue 15)', () => {
  it.each([
    ['strain', strain, 'sensor', { gaugeFactor: 1e308 }, 'sensor.gaugeFactor'],
    ['strain', strain, 'sensor', { gaugeFactor: 1e-17 }, 'sensor.gaugeFactor'],
    ['strain', strain, 'sensor', { gaugeOhms: 1e17 }, 'sensor.gaugeOhms'],
    ['rtd', rtd, 'sensor', { r0Ohms: 1e17 }, 'sensor.r0Ohms'],
    ['rtd', rtd, 'sensor', { r0Ohms: 1e-17 }, 'sensor.r0Ohms'],
    ['ntc', ntc, 'sensor', { referenceOhms: 1e17 }, 'sensor.referenceOhms'],
    ['ntc', ntc, 'sensor', { betaKelvin: 1e17 }, 'sensor.betaKelvin'],
    ['strain', strain, 'environment', { temperatureCelsius: 1e308 }, 'environment.temperatureCelsius'],
    ['ntc', ntc, 'environment', { temperatureCelsius: 1e308 }, 'environment.temperatureCelsius'],
    ['load', load, 'excitation', { volts: 5, sourceOhms: 1e308 }, 'excitation.sourceOhms'],
  ])('%s: %s %j → %s', (_name, spec, section, fields, path) => {
    expect(issuePaths(edit(spec, section, fields))).toEqual([path]);
  });

  it.each([1e308, 1e-308, 1e17, 1e-17])(
    'a data rate of %d Hz is refused at adc.filter.dataRateHertz, before any budget',
    (hertz) => {
      for (const spec of [strain, rtd, load, ntc]) {
        const s = structuredClone(spec) as ChannelSpec;
        (s.adc as Record<string, unknown>)['filter'] = { dataRateHertz: hertz };
        expect(issuePaths(s)).toEqual(['adc.filter.dataRateHertz']);
      }
    },
  );

  it('a data rate at the ends of the accepted range gives a budget (no error from the front end)', () => {
    for (const hertz of [1e-9, 1e12]) {
      const ch = createChannel({ ...load, adc: { ...load.adc, filter: { dataRateHertz: hertz } } });
      expect(Number.isFinite(channelBudget(ch).combined.standardUncertainty)).toBe(true);
    }
  });

  it("the front end's parameters are restated as channel fields, in the error's param and message", () => {
    expect(frontEndField('filter.dataRateHertz')).toBe('adc.filter.dataRateHertz');
    expect(frontEndField('excitationVolts')).toBe('excitation.volts');
    expect(frontEndField('gain')).toBe('amplifier.gain');
    expect(frontEndField('amplifier.limits.outputVolts')).toBe('amplifier.limits.outputVolts');
    expect(frontEndField('span.strainRange.max')).toBe('output.range');
    expect(frontEndField('somethingElse')).toBeUndefined();
    const thrown = () =>
      inChannelTerms(() => {
        throw new BridgeworkError(
          'out-of-range',
          '`filter.dataRateHertz` must be in [1e-9, 1e12] Hz; got 1e308',
          {
            param: 'filter.dataRateHertz',
            value: 1e308,
          },
        );
      });
    expect(thrown).toThrowBridgeworkError('out-of-range', { param: 'adc.filter.dataRateHertz' });
    expect(thrown).toThrow(/^`adc\.filter\.dataRateHertz` must be in \[1e-9, 1e12\] Hz; got 1e308$/);
    // Anything else passes through unchanged.
    const plain = new Error('not ours');
    expect(() =>
      inChannelTerms(() => {
        throw plain;
      }),
    ).toThrow(plain);
  });
});

describe('an old field name points to the field it became (issue 15; the renames of issue 13)', () => {
  /** The one issue of a spec, as data. */
  function onlyIssue(spec: unknown) {
    const v = validateChannelSpec(spec);
    expect(v.ok).toBe(false);
    const issues = v.ok ? [] : v.issues;
    expect(issues).toHaveLength(1);
    return issues[0]!;
  }

  it.each([
    ['adc', { dataRateHertz: 10 }, load, 'adc.dataRateHertz', 'adc.filter.dataRateHertz'],
    [
      'tolerances',
      { completionOhms: 0.001 },
      strain,
      'tolerances.completionOhms',
      'tolerances.completionOhmsFraction',
    ],
    [
      'tolerances',
      { excitationVolts: 0.001 },
      load,
      'tolerances.excitationVolts',
      'tolerances.excitationVoltsFraction',
    ],
    [
      'tolerances',
      { referenceVolts: 0.001 },
      load,
      'tolerances.referenceVolts',
      'tolerances.referenceVoltsFraction',
    ],
    ['tolerances', { gain: 0.001 }, load, 'tolerances.gain', 'tolerances.gainFraction'],
    [
      'tolerances',
      { gaugeFactor: 0.01 },
      strain,
      'tolerances.gaugeFactor',
      'sensor.gaugeFactorToleranceFraction',
    ],
    [
      'tolerances',
      { ratedOutput: 0.001 },
      load,
      'tolerances.ratedOutput',
      'sensor.ratedOutputToleranceFraction',
    ],
    [
      'tolerances',
      { temperatureCelsius: 1 },
      strain,
      'tolerances.temperatureCelsius',
      'tolerances.temperatureKelvin',
    ],
    ['sensor', { ratedOutput: 0.002 }, load, 'sensor.ratedOutput', 'sensor.ratedOutputVoltsPerVolt'],
    ['sensor', { capacityUnit: 'kilogram' }, load, 'sensor.capacityUnit', 'sensor.capacity'],
  ])('%s %j: the issue at %s names %s', (section, fields, spec, path, field) => {
    const issue = onlyIssue(edit(spec, section, fields));
    expect(issue.code).toBe('unknown-option');
    expect(issue.path).toBe(path);
    expect(issue.message).toMatch(/^unknown field: renamed; write /);
    expect(issue.message).toContain(field);
    expect(issue.suggestion).toContain(field);
  });

  it('under a channel-file path prefix as well, and other typos still get the closest name', () => {
    const v = validateChannelSpec(edit(load, 'adc', { dataRateHertz: 10 }), { path: 'channels.load' });
    expect(v.ok ? [] : v.issues.map((i) => [i.path, i.suggestion])).toEqual([
      ['channels.load.adc.dataRateHertz', expect.stringContaining('adc.filter.dataRateHertz')],
    ]);
    const typo = onlyIssue(edit(load, 'tolerances', { gainFractoin: 0.001 }));
    expect(typo.message).toBe("unknown field; did you mean 'gainFraction'?");
  });
});

describe("a span at the ends of a Pt100's range (issue 15): the limit in °C that differs from the value, and a way out that works", () => {
  const pt100 = (range: [number, number], gain = 2): ChannelSpec => ({
    sensor: { kind: 'rtd', r0Ohms: 100 },
    bridge: { wiring: 'three-wire', ohmsPerLead: 0.5 },
    excitation: { volts: 1 },
    amplifier: { gain },
    adc: { bits: 24, referenceVolts: 1, ratiometric: true },
    output: { quantity: 'temperature', range },
  });
  const issueOf = (spec: ChannelSpec) => {
    const v = validateChannelSpec(spec);
    expect(v.ok).toBe(false);
    const issues = v.ok ? [] : v.issues;
    expect(issues.map((i) => i.path)).toEqual(['output.range']);
    return issues[0]!;
  };

  it('−200 … 850 °C (IEC 60751): the nearest readings in °C (never "-200 °C past -200 °C"), and a range that is accepted', () => {
    const issue = issueOf(pt100([-200, 850]));
    expect(issue.message).toContain(
      "-200 °C is past what this channel reads (at least -199.99999 °C, the end of the sensor's range)",
    );
    expect(issue.message).toContain(
      "850 °C is past what this channel reads (at most 849.99968 °C, the end of the sensor's range)",
    );
    expect(issue.suggestion).toBe('narrow output.range to [-199.9 °C, 849.9 °C]');
    // The way out is accepted as written.
    expect(createChannel(pt100([-199.9, 849.9])).span).toEqual({ min: -199.9, max: 849.9 });
  });

  it("a span past the sensor's range gives its end; past the converter, the gain that fits, never a higher one", () => {
    const past = issueOf(pt100([-250, 100]));
    expect(past.message).toMatch(
      /^-250 °C is past what this channel reads \(at least -199\.99999 °C, the end of the sensor's range\)/,
    );
    expect(past.suggestion).toBe('narrow output.range to [-199.9 °C, 100 °C]');
    const rails = issueOf(pt100([-250, 100], 4));
    expect(rails.message).toMatch(/the converter's full scale at gain 4/);
    expect(rails.suggestion).not.toMatch(/amplifier\.gain to 8/);
    const high = issueOf(pt100([0, 850], 4));
    expect(high.suggestion).toMatch(
      /^lower amplifier\.gain to 2 or narrow output\.range to \[0 °C, 560\.\d+ °C\]$/,
    );
    expect(() => createChannel(pt100([0, 850], 2))).toThrow(/at most 849\.99968 °C/);
  });
});
