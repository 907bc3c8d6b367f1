import { describe, expect, it } from 'vitest';
import { createStrainBridge } from '@bridgework/bridge';
import { johnsonNoiseDensity } from '@bridgework/chain';
import {
  MAX_BUDGET_TRIALS,
  channelBudget,
  createChannel,
  validateChannelSpec,
  type ChannelSpec,
} from '@bridgework/channel';

const spec: ChannelSpec = {
  name: 'crane hook',
  sensor: { kind: 'strain-gauge', gaugeFactor: 2.0, gaugeOhms: 350, gaugeFactorToleranceFraction: 0.01 },
  bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 1.5 },
  excitation: { volts: 5 },
  amplifier: { gain: 128, inputVoltageNoiseVoltsPerRootHz: 10e-9 },
  adc: { bits: 24, referenceVolts: 5, ratiometric: true, filter: { order: 3, dataRateHertz: 10 } },
  tolerances: { gainFraction: 0.002, ohmsPerLead: 0.2 },
  output: { quantity: 'strain', unit: 'µε', range: [-2000, 2000] },
};

describe('budget: lines, models and the combined uncertainty', () => {
  const budget = channelBudget(createChannel(spec));

  it('is evaluated at the end of the span by default and names every line with its model and inputs', () => {
    expect(budget.at).toBe(2000);
    expect(budget.unit).toBe('µε');
    const names = budget.lines.map((l) => l.name);
    expect(names).toEqual(
      expect.arrayContaining([
        'noise',
        'resolution',
        'nonlinearity of a linear map',
        'lead desensitization',
        'gauge factor',
        'gain',
        'lead resistance',
      ]),
    );
    for (const line of budget.lines) {
      expect(line.model.length).toBeGreaterThan(20);
      // A tolerance names its distribution once (it was '… (rectangular); rectangular limits …').
      expect(line.model.match(/rectangular/g)?.length ?? 0).toBeLessThanOrEqual(1);
      expect(Object.keys(line.inputs).length).toBeGreaterThan(0);
      expect(Number.isFinite(line.value)).toBe(true);
    }
    expect(budget.caution).toMatch(/do not replace, qualified engineering judgement/);
  });

  it('combines uncorrelated contributions by root-sum-square (JCGM 100 eq. 10)', () => {
    const rss = Math.sqrt(Object.values(budget.combined.contributions).reduce((s, u) => s + u * u, 0));
    expect(budget.combined.standardUncertainty).toBeNear(rss, { rel: 1e-12 });
    const contributing = budget.lines.filter((l) => l.standardUncertainty !== undefined);
    expect(contributing.map((l) => l.name).sort()).toEqual(
      ['gain', 'gauge factor', 'lead resistance', 'noise'].sort(),
    );
  });

  it('has the sensitivities of the physics (derived): ε ∝ 1/GF exactly; the gain scales the ratio', () => {
    // u = a/√3 for rectangular limits ±a (JCGM 100 4.3.7).
    const gf = budget.lines.find((l) => l.name === 'gauge factor')!;
    expect(budget.combined.sensitivities['gauge factor']).toBeNear(-2000 / 2.0, { rel: 1e-6 });
    expect(gf.standardUncertainty).toBeNear((2000 * 0.01) / Math.sqrt(3), { rel: 1e-6 });
    // A gain error scales the measured ratio r: ∂ε/∂G = −(r/G)·dε/dr, with dε/dr from the bridge.
    const bridge = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 2,
      leads: { ohmsPerLead: 1.5, wiring: 'three-wire' },
    });
    const r = bridge.ratioFromStrain(2e-3);
    const h = 1e-6 * r;
    const slope = (bridge.strainFromRatio(r + h) - bridge.strainFromRatio(r - h)) / (2 * h);
    expect(budget.combined.sensitivities['gain']).toBeNear(-((r / 128) * slope) * 1e6, { rel: 1e-6 });
  });

  it('refers the noise to the output through the exact slope (checked against the bridge and Johnson noise)', () => {
    const zero = channelBudget(createChannel(spec), { at: 0 });
    const bridge = createStrainBridge({
      arrangement: 'quarter',
      gaugeFactor: 2,
      leads: { ohmsPerLead: 1.5, wiring: 'three-wire' },
    });
    // dε/dV at zero = 1/(dr/dε · E), in µε per volt.
    expect(zero.quantityPerVolt).toBeNear(1e6 / (bridge.sensitivity * 5), { rel: 1e-9 });
    const thermal = zero.noise.terms.find((t) => t.source === 'bridge-thermal')!;
    // The thermal noise of the bridge output resistance over the sinc3 ENBW (0.275·fODR, derived in chain).
    expect(zero.noise.bandwidthHertz).toBeNear(2.75, { rel: 1e-4 });
    const outputOhms =
      thermal.rmsVolts / Math.sqrt(2.75) / johnsonNoiseDensity({ ohms: 1, temperatureCelsius: 20 });
    expect(outputOhms ** 2).toBeNear(350.75, { rel: 2e-3 }); // (350 + 1.5)/2 + 175, with the leads
    expect(zero.noise.totalRms).toBeNear(Math.sqrt(zero.noise.terms.reduce((s, t) => s + t.rms * t.rms, 0)), {
      rel: 1e-12,
    });
  });

  it('reports the lead desensitization a lead-blind map would make (three-wire: about RL/(Rg + RL))', () => {
    const line = budget.lines.find((l) => l.name === 'lead desensitization')!;
    expect(line.value / 2000).toBeNear(-1.5 / 351.5, { rel: 2e-3 });
  });

  it('states the nonlinearity of a linear map against the textbook quarter-bridge inverse', () => {
    const noLeads = channelBudget(
      createChannel({
        ...spec,
        bridge: { arrangement: 'quarter', wiring: 'three-wire' },
        tolerances: {},
      }),
    );
    const line = noLeads.lines.find((l) => l.name === 'nonlinearity of a linear map')!;
    // ε(r) = 4r/(GF(1 − 2r)) (textbook quarter-bridge inverse), chord through ±2000 µε, sampled densely.
    const eps = (r: number) => (4 * r) / (2 * (1 - 2 * r));
    const r1 = (2 * -2e-3) / (4 + 4 * -2e-3);
    const r2 = (2 * 2e-3) / (4 + 4 * 2e-3);
    let worst = 0;
    for (let i = 0; i <= 100_000; i++) {
      const r = r1 + ((r2 - r1) * i) / 100_000;
      const chord = -2000 + (4000 * (r - r1)) / (r2 - r1);
      const d = eps(r) * 1e6 - chord;
      if (Math.abs(d) > Math.abs(worst)) worst = d;
    }
    expect(line.value).toBeNear(worst, { rel: 1e-3 });
  });

  it('agrees with a Monte Carlo evaluation (JCGM 101) for this nearly linear model', () => {
    const mc = channelBudget(createChannel(spec), { monteCarlo: { trials: 100_000, seed: 7 } }).monteCarlo!;
    expect(mc.trials).toBe(100_000);
    // Relative standard error of a standard deviation from M trials ≈ 1/√(2M) = 0.22 %; allow 2 %.
    expect(mc.standardUncertainty).toBeNear(budget.combined.standardUncertainty, { rel: 0.02 });
    expect(mc.value).toBeNear(2000, { abs: 0.05 });
  });

  it('returns the Monte Carlo model values on request, the same run as without them', () => {
    const channel = createChannel(spec);
    const plain = channelBudget(channel, { monteCarlo: { trials: 5000, seed: 3 } }).monteCarlo!;
    const kept = channelBudget(channel, {
      monteCarlo: { trials: 5000, seed: 3, returnValues: true },
    }).monteCarlo!;
    expect(plain.values).toBeUndefined();
    expect(kept.values).toHaveLength(5000);
    expect(kept.value).toBe(plain.value);
    expect(kept.standardUncertainty).toBe(plain.standardUncertainty);
    // The estimate is the mean of the values (JCGM 101 7.6), recomputed here from them.
    let sum = 0;
    for (const v of kept.values!) sum += v;
    expect(sum / 5000).toBeNear(kept.value, { rel: 1e-12 });
  });

  it('reports progress per block of 16 384 trials and stops when its signal is aborted', () => {
    const channel = createChannel(spec);
    const seen: number[] = [];
    const full = channelBudget(channel, {
      monteCarlo: { trials: 40_000, seed: 3, onProgress: (p) => seen.push(p.trials) },
    }).monteCarlo!;
    expect(seen).toEqual([16_384, 32_768, 40_000]);
    // Aborted from the progress hook after the first block: the run throws the signal's reason.
    const controller = new AbortController();
    const reason = new Error('stopped by the test');
    let calls = 0;
    expect(() =>
      channelBudget(channel, {
        monteCarlo: {
          trials: 40_000,
          seed: 3,
          signal: controller.signal,
          onProgress: () => {
            calls++;
            controller.abort(reason);
          },
        },
      }),
    ).toThrow(reason);
    expect(calls).toBe(1);
    // Without a reason: a closed error; never aborted: the same run as without a signal.
    expect(() =>
      channelBudget(channel, { monteCarlo: { trials: 5000, signal: { aborted: true } } }),
    ).toThrowBridgeworkError('closed', { param: 'signal' });
    const watched = channelBudget(channel, {
      monteCarlo: { trials: 40_000, seed: 3, signal: new AbortController().signal },
    }).monteCarlo!;
    expect(watched.value).toBe(full.value);
    expect(() =>
      channelBudget(channel, { monteCarlo: { trials: 5000, signal: 'stop' as never } }),
    ).toThrowBridgeworkError('wrong-type', { param: 'options.monteCarlo.signal' });
  });

  it('adds the IEC 60751 class tolerance of an RTD (class A at 100 °C: ±0.35 °C)', () => {
    const rtd = channelBudget(
      createChannel({
        sensor: { kind: 'rtd', toleranceClass: 'A' },
        bridge: { wiring: 'three-wire' },
        excitation: { volts: 1 },
        amplifier: { gain: 8 },
        adc: { bits: 24, referenceVolts: 1, ratiometric: true },
        output: { quantity: 'temperature', range: [0, 100] },
      }),
      { at: 100 },
    );
    const line = rtd.lines.find((l) => l.name === 'RTD class tolerance')!;
    expect(line.value).toBeNear(0.35, { rel: 1e-12 });
    expect(rtd.combined.contributions['RTD class tolerance']).toBeNear(0.35 / Math.sqrt(3), { rel: 1e-9 });
    expect(line.model).toBe(
      'IEC 60751 class A (wire-wound) limits ±(0.15 + 0.002·|t|) °C at 100 °C; rectangular limits (u = a/√3, JCGM 100 4.3.7)',
    );
  });

  it('flags headroom: an output swing too small for the span fails the check', () => {
    const tight = channelBudget(
      createChannel({
        ...spec,
        amplifier: { gain: 128, limits: { outputVolts: [-0.1, 0.1] } },
      }),
    );
    expect(tight.ok).toBe(false);
    expect(tight.frontEnd.issues.length).toBeGreaterThan(0);
    expect(tight.checks.filter((c) => c.status === 'fail').map((c) => c.id)).toEqual(
      expect.arrayContaining(['headroom-output-low', 'headroom-output-high']),
    );
    expect(budget.ok).toBe(true);
  });

  it('names a headroom point at zero as 0, not as its rounding dust (issue 15 item 21)', () => {
    // A thermistor divider over 0 … 90 °C: its high-rail margin is worst at 0 °C, which the ratio
    // gives back as −3.6e−15 °C.
    const kiln = channelBudget(
      createChannel({
        sensor: { kind: 'thermistor', referenceOhms: 10000, betaKelvin: 3950 },
        excitation: { volts: 2.5 },
        adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
        output: { quantity: 'temperature', range: ['0 °C', '90 °C'] },
      }),
    );
    const high = kiln.checks.find((c) => c.id === 'headroom-adc-high');
    expect(high?.message).toMatch(/ at 0\u00a0°C, margin/);
    for (const c of kiln.checks) expect(c.message).not.toMatch(/e[−-]1[0-9]/);
  });

  it('rejects a budget point the channel cannot convert, and a lead tolerance beyond the leads', () => {
    expect(() => channelBudget(createChannel(spec), { at: 1e9 })).toThrowBridgeworkError('out-of-range', {
      param: 'options.at',
    });
    // Found once, when the spec is validated: the lead tolerance cannot exceed the lead resistance.
    const noLeads = validateChannelSpec({
      ...spec,
      bridge: { arrangement: 'quarter', wiring: 'three-wire' },
    });
    expect(noLeads.issues).toEqual([
      expect.objectContaining({ code: 'out-of-range', path: 'tolerances.ohmsPerLead', limit: '0 Ω' }),
    ]);
  });
});

describe('budget: transducer temperature effects over the stated range', () => {
  it('zero and span coefficients enter as a temperature line (data-sheet definitions, derived)', () => {
    const cell: ChannelSpec = {
      sensor: {
        kind: 'transducer',
        capacity: 10_000,
        ratedOutputVoltsPerVolt: '2 mV/V',
        zeroTemperatureCoefficientPerKelvin: 2e-5,
        spanTemperatureCoefficientPerKelvin: 1e-5,
        certificateCelsius: 20,
      },
      excitation: { volts: 10 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 10, ratiometric: true },
      environment: { temperatureCelsius: 20, rangeCelsius: [0, 40] },
      output: { quantity: 'force', range: [0, 10_000] },
    };
    const b = channelBudget(createChannel(cell), { at: 8000 });
    const line = b.lines.find((l) => l.name === 'transducer temperature')!;
    // load = C·(r − TK0·RO·ΔT)/(RO(1 + TKC·ΔT)) ⇒ ∂load/∂T = −C·TK0 − load·TKC at ΔT = 0.
    const expected = -10_000 * 2e-5 - 8000 * 1e-5;
    expect(b.combined.sensitivities['transducer temperature']).toBeNear(expected, { rel: 1e-6 });
    expect(line.standardUncertainty).toBeNear((Math.abs(expected) * 20) / Math.sqrt(3), { rel: 1e-6 });
    // And the map itself moves with the temperature: at 40 °C a given code reads lower.
    const warm = createChannel({
      ...cell,
      environment: { temperatureCelsius: 40, zeroTemperatureCelsius: 20 },
    });
    const code = createChannel(cell).codeFromQuantity(8000);
    expect(warm.quantityFromCode(code)).toBeNear((8000 - 10_000 * 2e-5 * 20) / (1 + 1e-5 * 20), {
      rel: 1e-6,
    });
  });
});

describe('budget: a span end too close to the end of the sensor’s range for its tolerances', () => {
  // IEC 60751: the Callendar–Van Dusen curve is defined up to 850 °C. With a 0.5 % excitation
  // tolerance on an absolute reference, a reading at 849 °C moves by about 10 °C: past the curve.
  const rtd = (range: [number, number]) =>
    createChannel({
      sensor: { kind: 'rtd' },
      excitation: { volts: 1 },
      adc: { bits: 24, referenceVolts: 1 },
      tolerances: { excitationVoltsFraction: 0.005 },
      output: { quantity: 'temperature', range },
    });

  it('is refused against output.range, in the user’s unit, with a way out', () => {
    expect(() => channelBudget(rtd([0, 849]))).toThrowBridgeworkError('out-of-range', {
      param: 'output.range',
    });
    expect(() => channelBudget(rtd([0, 849]))).toThrow(/849 °C .*excitation.*narrow output\.range/);
  });

  it('is evaluated when the span leaves room', () => {
    expect(channelBudget(rtd([0, 800])).ok).toBe(true);
  });

  it('the default span of an RTD leaves 1 % of the curve’s range at each end (−200 … 850 °C)', () => {
    const c = createChannel({
      sensor: { kind: 'rtd' },
      excitation: { volts: 1 },
      adc: { bits: 24, referenceVolts: 1 },
      output: { quantity: 'temperature' },
    });
    expect(c.span.min).toBeNear(-189.5, { abs: 1e-9 });
    expect(c.span.max).toBeNear(839.5, { abs: 1e-9 });
  });
});

describe('a transducer budget without the sensor calibration is flagged (issue 15)', () => {
  const cell: ChannelSpec = {
    sensor: { kind: 'transducer', capacity: '20 t', ratedOutputVoltsPerVolt: '2 mV/V' },
    excitation: { volts: 5 },
    amplifier: { gain: 128 },
    adc: { bits: 24, referenceVolts: 5, ratiometric: true },
    output: { quantity: 'mass', unit: 't', range: [0, 20] },
  };

  it('warns, naming sensor.ratedOutputToleranceFraction, when the rated output has no tolerance', () => {
    const b = channelBudget(createChannel(cell));
    const check = b.checks.find((c) => c.id === 'sensor-calibration')!;
    expect(check).toMatchObject({ status: 'warn', ok: true, path: 'sensor.ratedOutputToleranceFraction' });
    expect(check.message).toMatch(/lacks the transducer's calibration uncertainty/);
    expect(check.message).toMatch(/covers the electronics and the noise only/);
    // What it says is so: no budget line comes from the sensor's calibration.
    expect(b.lines.map((l) => l.name)).not.toContain('rated output');
  });

  it('passes, stating the tolerance, once it is filled in (and the line is in the budget)', () => {
    const b = channelBudget(
      createChannel({
        ...cell,
        sensor: { ...cell.sensor, ratedOutputToleranceFraction: '0.1 %' },
      } as ChannelSpec),
    );
    const check = b.checks.find((c) => c.id === 'sensor-calibration')!;
    expect(check.status).toBe('pass');
    expect(check.message).toBe(
      "the budget holds the rated output's tolerance ±0.1\u00a0% (sensor.ratedOutputToleranceFraction)",
    );
    expect(b.lines.map((l) => l.name)).toContain('rated output');
  });

  it('does not apply to a channel read as a bridge ratio', () => {
    const ratio = channelBudget(
      createChannel({ ...cell, output: { quantity: 'ratio', unit: 'mV/V', range: [0, 2] } }),
    );
    expect(ratio.checks.some((c) => c.id === 'sensor-calibration')).toBe(false);
  });
});

describe('each sensor kind says what its budget lacks of the sensor (sensor-calibration)', () => {
  const check = (s: ChannelSpec) =>
    channelBudget(createChannel(s)).checks.find((c) => c.id === 'sensor-calibration');
  const lineNames = (s: ChannelSpec) => channelBudget(createChannel(s)).lines.map((l) => l.name);
  const rtdSpec = (sensor: Record<string, unknown>): ChannelSpec =>
    ({
      sensor: { kind: 'rtd', ...sensor },
      bridge: { wiring: 'three-wire' },
      excitation: { volts: 1 },
      amplifier: { gain: 8 },
      adc: { bits: 24, referenceVolts: 1, ratiometric: true },
      output: { quantity: 'temperature', range: [0, 100] },
    }) as ChannelSpec;
  const ntc = (sensor: Record<string, unknown>): ChannelSpec =>
    ({
      sensor: { kind: 'thermistor', referenceOhms: 10_000, ...sensor },
      bridge: { completionOhms: 10_000 },
      excitation: { volts: 1 },
      amplifier: { gain: 1 },
      adc: { bits: 24, referenceVolts: 1, ratiometric: true },
      output: { quantity: 'temperature', range: [-10, 50] },
    }) as ChannelSpec;
  const sh = { steinhartHart: { a: 1.1292e-3, b: 2.3411e-4, c: 8.7755e-8 } }; // a common 10 kΩ NTC's coefficients (from memory)

  it('strain gauge: warns without the gauge factor tolerance, and the budget indeed has no such line', () => {
    const bare = {
      ...spec,
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.0, gaugeOhms: 350 },
    } as ChannelSpec;
    expect(check(bare)).toMatchObject({ status: 'warn', path: 'sensor.gaugeFactorToleranceFraction' });
    expect(check(bare)!.message).toMatch(
      /lacks the gauge factor's tolerance: .* is 0, so U covers the electronics and the noise only/,
    );
    expect(lineNames(bare)).not.toContain('gauge factor');
    expect(check(spec)).toMatchObject({ status: 'pass', value: 0.01 });
    expect(check(spec)!.message).toBe(
      "the budget holds the gauge factor's tolerance ±1\u00a0% (sensor.gaugeFactorToleranceFraction)",
    );
    expect(lineNames(spec)).toContain('gauge factor');
  });

  it('RTD: warns without an IEC 60751 class; a class passes and is a line', () => {
    expect(check(rtdSpec({}))).toMatchObject({ status: 'warn', path: 'sensor.toleranceClass' });
    expect(check(rtdSpec({}))!.message).toMatch(
      /lacks the RTD's tolerance: sensor\.toleranceClass is not set/,
    );
    expect(lineNames(rtdSpec({}))).not.toContain('RTD class tolerance');
    // IEC 60751:2008 class B: ±(0.3 + 0.005·|t|) °C.
    expect(check(rtdSpec({ toleranceClass: 'B' }))).toMatchObject({ status: 'pass', value: 0.3, unit: '°C' });
    expect(check(rtdSpec({ toleranceClass: 'B' }))!.message).toMatch(
      /class B's tolerance ±\(0\.3 \+ 0\.005·\|t\|\) °C/,
    );
    expect(lineNames(rtdSpec({ toleranceClass: 'B' }))).toContain('RTD class tolerance');
  });

  it('thermistor: a sensor without tolerances (beta or Steinhart–Hart) warns instead of a silent noise-only budget', () => {
    for (const sensor of [{ betaKelvin: 3435 }, sh]) {
      const c = check(ntc(sensor))!;
      expect(c).toMatchObject({ status: 'warn', path: 'sensor.referenceOhmsToleranceFraction' });
      expect(c.message).toMatch(
        /lacks the thermistor's tolerance: sensor\.referenceOhmsToleranceFraction is 0/,
      );
      expect(lineNames(ntc(sensor))).not.toContain('thermistor resistance');
    }
    const held = check(
      ntc({ betaKelvin: 3435, referenceOhmsToleranceFraction: 0.01, betaToleranceFraction: 0.01 }),
    )!;
    expect(held.status).toBe('pass');
    expect(held.message).toMatch(/resistance tolerance ±1\u00a0% .* and the beta tolerance ±1\u00a0%/);
    expect(lineNames(ntc({ betaKelvin: 3435, referenceOhmsToleranceFraction: 0.01 }))).toContain(
      'thermistor resistance',
    );
  });

  it('a calibration against reference loads holds the sensor calibration in its fit: no check, the fit is a line', () => {
    const cell: ChannelSpec = {
      ...spec,
      sensor: { kind: 'transducer', capacity: '20 t', ratedOutputVoltsPerVolt: '2 mV/V' },
      bridge: { wiring: 'six-wire' },
      tolerances: { gainFraction: 0.002 },
      output: { quantity: 'mass', unit: 't', range: [0, 20] },
    } as ChannelSpec;
    expect(check(cell)?.status).toBe('warn');
    const calibrated = {
      ...cell,
      calibration: {
        unit: 't',
        coefficients: [0, 1e-4],
        covariance: [1e-14, 0, 0, 1e-18],
        range: [0, 20],
        points: 11,
      },
    } as ChannelSpec;
    expect(check(calibrated)).toBeUndefined();
    expect(lineNames(calibrated)).toContain('calibration fit');
  });
});

describe('channelBudget options are checked, never read loosely (issue 15, items 6 and 8)', () => {
  const ch = createChannel(spec);
  it.each([
    [0, 'wrong-type'],
    ['no', 'wrong-type'],
    [Number.NaN, 'wrong-type'],
    [-1, 'wrong-type'],
    [null, 'wrong-type'],
    [[], 'wrong-type'],
  ] as const)(
    'monteCarlo: %s is %s naming options.monteCarlo (was: 10⁵ trials run, or a TypeError)',
    (value, code) => {
      expect(() => channelBudget(ch, { monteCarlo: value as never })).toThrowBridgeworkError(code, {
        param: 'options.monteCarlo',
      });
    },
  );

  it.each([1, 'yes', null, {}])('monteCarlo.returnValues: %s is wrong-type', (value) => {
    expect(() =>
      channelBudget(ch, { monteCarlo: { trials: 1000, returnValues: value as never } }),
    ).toThrowBridgeworkError('wrong-type', { param: 'options.monteCarlo.returnValues' });
  });

  it('monteCarlo.trials beyond the memory-derived limit is refused at once (was: hours of work)', () => {
    const started = Date.now();
    expect(() => channelBudget(ch, { monteCarlo: { trials: 1e9 } })).toThrowBridgeworkError('out-of-range', {
      param: 'options.monteCarlo.trials',
    });
    expect(() => channelBudget(ch, { monteCarlo: { trials: MAX_BUDGET_TRIALS + 1 } })).toThrowBridgeworkError(
      'out-of-range',
      { param: 'options.monteCarlo.trials' },
    );
    // Refused before any trial runs (a generous bound on a shared machine; nothing near hours).
    expect(Date.now() - started).toBeLessThan(5_000);
  });

  it('a misspelt option or Monte Carlo setting names the closest key', () => {
    expect(() => channelBudget(ch, { monteCarol: true } as never)).toThrowBridgeworkError('unknown-option', {
      param: 'options.monteCarol',
    });
    expect(() => channelBudget(ch, { monteCarlo: { trails: 1000 } } as never)).toThrowBridgeworkError(
      'unknown-option',
      { param: 'options.monteCarlo.trails' },
    );
  });
});
