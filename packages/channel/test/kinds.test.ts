/**
 * The touch points of the redesign: a sensor kind is its module plus one registry line (a fake
 * kind is added here through a kit, never in src/), and an arrangement is one row of the bridge
 * package's table (a fake row is added here, and removed again, in one test).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { arrangementTable, strainArrangements } from '@bridgework/bridge';
import { channelBudget, createChannel } from '@bridgework/channel';
import { createChannelKit } from '../src/channelKit.js';
import { kitSpecFields, kitSpecJsonSchema } from '../src/channelSpecReference.js';
import { builtInKindBudgets } from '../src/kinds/budgetRegistry.js';
import { builtInSensorKinds } from '../src/kinds/registry.js';
import type { SensorKind } from '../src/kinds/SensorKind.js';
import { fakeKind } from './support/fakeKind.js';
import { D, X, arm1Ref, ratioFromCodeRef } from './support/reference.js';

describe('a sensor kind is its module and one registry line', () => {
  const kit = createChannelKit({ sensorKinds: [...builtInSensorKinds, fakeKind] });
  const spec = {
    sensor: { kind: 'resistive-film', sensitivity: 4, r0Ohms: '1 kΩ' },
    bridge: { ohmsPerLead: 0.4 },
    excitation: { volts: 2.5 },
    amplifier: { gain: 32 },
    adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
    output: { quantity: 'strain', unit: 'µε' },
  };

  it('validates with the kind’s own fields and defaults, and documents them', () => {
    const v = kit.validateChannelSpec(spec);
    expect(v.issues).toEqual([]);
    expect((v.value as { bridge: { wiring: string; completionOhms: number } }).bridge).toMatchObject({
      wiring: 'three-wire', // the quarter arrangement's default, from the bridge table
      completionOhms: 1000, // the kind's nominal resistance
    });
    expect(kitSpecFields(kit).find((r) => r.path === 'sensor<resistive-film>.sensitivity')).toMatchObject({
      presence: 'required',
    });
    expect(JSON.stringify(kitSpecJsonSchema(kit))).toContain('"const":"resistive-film"');
    const typo = kit.validateChannelSpec({ ...spec, sensor: { kind: 'resistive-flim', sensitivity: 4 } });
    expect(typo.issues).toEqual([
      expect.objectContaining({
        code: 'invalid-option',
        path: 'sensor.kind',
        suggestion: "write 'resistive-film'",
      }),
    ]);
    // The built-in kit does not know it: the kind is added in one place.
    expect(createChannel.length).toBe(1);
  });

  it('converts exactly (a 40-digit solve of arm 1) and budgets through the composed map', () => {
    const channel = kit.createChannel(spec);
    expect(channel.description).toBe('resistive film, R0 1000 Ω, k 4');
    expect(channel.span).toEqual({ min: -1000, max: 1000 });
    for (const code of [-3_000_000, -12_345, 0, 777_777, 3_500_000]) {
      // Three-wire: R1 = R + RL, R2 = Rc + RL, R3 = R4 = Rc; R = R0(1 + kε).
      const r = ratioFromCodeRef(code, 32, 24);
      const rl = X(0.4);
      const arm = arm1Ref(r, X(1000).plus(rl), X(1000), X(1000), new D(0));
      const strain = arm.minus(rl).div(1000).minus(1).div(4).times(1e6).toNumber();
      expect(channel.quantityFromCode(code)).toBeNear(strain, { rel: 1e-12, abs: 1e-9 });
    }
    const budget = channelBudget(channel, { at: 500 });
    expect(budget.model).toBe('composed'); // no closed form given: the exact map per evaluation
    expect(budget.ok).toBe(true);
  });

  it('a kind without a budget side converts, and its budget is refused naming the kind', () => {
    const { budget: _dropped, ...bare } = fakeKind;
    const bareKit = createChannelKit({ sensorKinds: [...builtInSensorKinds, bare] });
    const channel = bareKit.createChannel(spec);
    expect(channel.quantityFromCode(0)).toBeNear(0, { abs: 1e-9 });
    expect(() => channelBudget(channel)).toThrowBridgeworkError('missing-option', { param: 'sensor.kind' });
  });
});

describe('the built-in kinds keep their budget side apart from the conversion path', () => {
  it('no built-in kind object carries budget methods; the budget registry has each one’s', () => {
    for (const kind of builtInSensorKinds) {
      for (const key of ['budget', 'budgetInputs', 'budgetLines', 'fastMap', 'plausibleRanges'])
        expect(Object.hasOwn(kind, key), `${kind.name}.${key}`).toBe(false);
      expect(builtInKindBudgets.get(kind as unknown as SensorKind)?.budgetInputs, kind.name).toBeTypeOf(
        'function',
      );
    }
    expect(builtInKindBudgets.size).toBe(builtInSensorKinds.length);
    // The conversion modules do not import the budget ones (the bundle-size split; the consumer test measures it).
    for (const name of ['strainGauge', 'transducer', 'rtd', 'thermistor', 'registry', 'SensorKind']) {
      const text = readFileSync(new URL(`../src/kinds/${name}.ts`, import.meta.url), 'utf8');
      expect(text, name).not.toMatch(/from '\.\/(\w+Budget|budgetRegistry)\.js'/);
    }
  });
});

/** The invented arrangement of the worked example in docs/channel.md: three active gauges and one completion resistor. */
const threeActiveRow = {
  arms: [[1, 0], [-1, 0], [1, 0], null],
  wirings: ['three-wire'],
  measures: 'normal',
} as const;

describe('an arrangement is one row of the bridge package’s table', () => {
  it('a fake row measures strain through the channel, checked by a 40-digit network solve', () => {
    // Three active gauges (arms 1, 2, 3 at ε, −ε, ε) and one completion resistor: invented.
    const name = 'three-active';
    const table = arrangementTable as unknown as Record<string, unknown>;
    const list = strainArrangements as unknown as string[];
    // The row exactly as docs/channel.md shows it (a test there compares the two).
    table[name] = threeActiveRow;
    list.push(name);
    try {
      const kit = createChannelKit({ sensorKinds: builtInSensorKinds });
      const spec = {
        sensor: { kind: 'strain-gauge', gaugeFactor: 2, gaugeFactorToleranceFraction: 0.01 },
        bridge: { arrangement: name, ohmsPerLead: 0.5 },
        excitation: { volts: 5 },
        amplifier: { gain: 64 },
        adc: { bits: 24, referenceVolts: 5, ratiometric: true },
        output: { quantity: 'strain', unit: 'µε', range: [-1500, 1500] },
      };
      const v = kit.validateChannelSpec(spec);
      expect(v.issues).toEqual([]);
      expect((v.value as { bridge: { wiring: string } }).bridge.wiring).toBe('three-wire');
      const channel = kit.createChannel(spec);
      // Reference: R1 = Rg(1 + GFε) + RL, R2 = Rg(1 − GFε) + RL, R3 = Rg(1 + GFε), R4 = Rc; ratio
      // (R1R3 − R2R4)/((R1 + R2)(R3 + R4)) solved for ε by bisection at 40 digits.
      const ratioOf = (e: InstanceType<typeof D>) => {
        const g = new D(350);
        const rl = X(0.5);
        const r1 = g.times(e.times(2).plus(1)).plus(rl);
        const r2 = g.times(new D(1).minus(e.times(2))).plus(rl);
        const r3 = g.times(e.times(2).plus(1));
        const r4 = g;
        return r1
          .times(r3)
          .minus(r2.times(r4))
          .div(r1.plus(r2).times(r3.plus(r4)));
      };
      for (const code of [-2_000_000, -5, 0, 1_234_567, 2_500_000]) {
        const r = ratioFromCodeRef(code, 64, 24);
        let lo = new D(-0.1);
        let hi = new D(0.1);
        for (let i = 0; i < 140; i++) {
          const mid = lo.plus(hi).div(2);
          if (ratioOf(mid).lessThan(r)) lo = mid;
          else hi = mid;
        }
        expect(channel.quantityFromCode(code)).toBeNear(lo.times(1e6).toNumber(), { rel: 1e-12, abs: 1e-9 });
      }
      // The closed-form Monte Carlo model reads the same row and agrees with the composed map.
      const budget = channelBudget(channel);
      expect(budget.model).toBe('closed-form');
      // The row says it measures normal strain: stress (σ = E·ε, uniaxial Hooke's law) follows with
      // no other change, and a shear quantity is refused with the reason.
      const stress = kit.createChannel({
        ...spec,
        output: { quantity: 'stress', unit: 'MPa', range: [-300, 300], modulusPascals: 200e9 },
      });
      for (const code of [-2_000_000, 1_234_567])
        expect(stress.quantityFromCode(code)).toBeNear(
          (channel.quantityFromCode(code) * 1e-6 * 200e9) / 1e6,
          {
            rel: 1e-14,
          },
        );
      expect(
        kit.validateChannelSpec({ ...spec, output: { quantity: 'torque', shaftDiameterMeters: 0.05 } })
          .issues,
      ).toEqual([expect.objectContaining({ path: 'output.quantity' })]);
      expect(budget.combined.contributions['gauge factor']).toBeNear((1500 * 0.01) / Math.sqrt(3), {
        rel: 1e-6,
      });
    } finally {
      delete table[name];
      list.splice(list.indexOf(name), 1);
    }
    expect(strainArrangements).not.toContain(name);
  });
});

describe('docs/channel.md: the worked examples are the code', () => {
  const docs = readFileSync(new URL('../../../docs/channel.md', import.meta.url), 'utf8');
  /** The first fenced block after a marker comment. */
  const blockAfter = (marker: string): string => {
    const at = docs.indexOf(`<!-- worked-example: ${marker} -->`);
    expect(at, `docs/channel.md has the marker ${marker}`).toBeGreaterThan(0);
    const m = /```ts\n([\s\S]*?)```/.exec(docs.slice(at));
    return (m?.[1] ?? '').trimEnd();
  };

  it('the sensor kind module is test/support/fakeKind.ts (import paths as in src/kinds/)', () => {
    const file = readFileSync(new URL('./support/fakeKind.ts', import.meta.url), 'utf8');
    const module = file
      .slice(file.indexOf('import '))
      .replace("'../../src/kinds/SensorKind.js'", "'./SensorKind.js'")
      .replace("'../../src/spec/schema.js'", "'../spec/schema.js'")
      .trimEnd();
    expect(blockAfter('packages/channel/test/support/fakeKind.ts')).toBe(module);
    // The registry block lists the built-in kinds in the registry's order, then the new one.
    const registry = readFileSync(new URL('../src/kinds/registry.ts', import.meta.url), 'utf8');
    const names = (text: string) => /builtInSensorKinds = \[([^\]]*)\]/.exec(text)?.[1]?.match(/\w+/g) ?? [];
    const at = docs.indexOf('gains its name:');
    expect(names(docs.slice(at))).toEqual([...names(registry), 'fakeKind']);
    expect(names(registry)).toHaveLength(builtInSensorKinds.length);
  });

  it('the arrangement row is the one the test above adds', () => {
    const block = blockAfter('threeActiveRow in packages/channel/test/kinds.test.ts');
    const row = new Function(`return { ${block} };`)() as Record<string, unknown>;
    expect(row).toEqual({ 'three-active': threeActiveRow });
  });
});
