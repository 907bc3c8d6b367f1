/**
 * Prints the tables of docs/firmware.md ("Budgets"): the functions chosen for the demo channels
 * (default targets) and for the issue's temperature channels at 0.01 °C, each verified over every
 * code. Takes about two minutes (the exact maps are evaluated at some 40 million codes).
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source test/support/writeFirmwareTable.ts
 */
import {
  channelConstants,
  createChannel,
  type ChannelConstants,
  type ChannelSpec,
} from '@bridgework/channel';
import { createSteinhartHartThermistor } from '@bridgework/compensation';
import { designFirmwareConstants, firmwareCost, type FirmwareMap } from '@bridgework/firmware';
import { footbridgeNames, footbridgeSpecs } from '../../packages/cli/test/support/footbridge.js';

const TYPES = ['fixed', 'float32', 'float64'] as const;
const DEGREE = ['constant', 'linear', 'quadratic', 'cubic', 'quartic', 'quintic'];

function form(map: FirmwareMap): string {
  if (map.kind === 'piecewise-polynomial')
    return `${DEGREE[map.degree]}, ${map.segmentCount} × 2^${map.segmentBits}`;
  return map.kind === 'mobius' ? 'Möbius' : 'affine';
}

function ops(map: FirmwareMap): string {
  const c = firmwareCost(map);
  const parts = [`${c.multiplies} mul`, `${c.additions} add`];
  if (c.shifts > 0) parts.push(`${c.shifts} shift`);
  if (c.divisions > 0) parts.push(`${c.divisions} div`);
  return parts.join(', ');
}

const g = (x: number) => String(Number(x.toPrecision(3)));

function rows(
  name: string,
  unit: string,
  target: number,
  c: {
    readonly fixed?: FirmwareMap | undefined;
    readonly float32?: FirmwareMap | undefined;
    readonly float64?: FirmwareMap | undefined;
    readonly totals: ChannelConstants['totals'];
  },
  codes: number,
): string[] {
  return TYPES.flatMap((t) => {
    const map = c[t];
    const total = c.totals[t];
    if (map === undefined || total === undefined) return [];
    return [
      `| ${name} | ${codes} | ${g(target)} ${unit} | ${t} | ${form(map)} | ${firmwareCost(map).tableBytes} | ${ops(map)} | ${g(total.bound)} ${unit} (${total.proved ? 'proved' : 'measured'}) |`,
    ];
  });
}

const header = [
  '| channel | codes | target | type | form | table bytes | per conversion | total error |',
  '| --- | --- | --- | --- | --- | --- | --- | --- |',
];
const out = [...header];
for (const n of footbridgeNames) {
  const ch = createChannel(footbridgeSpecs[n]);
  const c = channelConstants(ch);
  out.push(...rows(n, ch.unit, c.targetError, c, c.codeMax - c.codeMin + 1));
}
const bath: ChannelSpec = {
  name: 'bath-pt100',
  sensor: { kind: 'rtd', r0Ohms: 100, toleranceClass: 'B' },
  bridge: { wiring: 'three-wire', ohmsPerLead: 0.5 },
  excitation: { volts: 0.5 },
  amplifier: { gain: 4, inputVoltageNoiseVoltsPerRootHz: 15e-9 },
  adc: { bits: 24, referenceVolts: 0.5, ratiometric: true, filter: { dataRateHertz: 10 } },
  environment: { temperatureCelsius: 25, rangeCelsius: [15, 35] },
  tolerances: { completionOhmsFraction: 0.0001, ohmsPerLead: 0.05 },
  output: { quantity: 'temperature', range: [-50, 200] },
};
const deck = createChannel(footbridgeSpecs['deck-temp']);
const issue = [
  ['bath-pt100 (issue 14)', createChannel(bath), {}],
  ['deck-temp', deck, {}],
  [
    'Pt100 −199.99 … 849.99 °C, gain 2',
    createChannel({
      ...bath,
      name: 'pt100-wide',
      // IEC 60751 states class B only for −196 … 600 °C: the wide span has no class.
      sensor: { kind: 'rtd', r0Ohms: 100 },
      amplifier: { gain: 2 },
      output: { quantity: 'temperature', range: [-199.99, 849.99] }, // strictly inside the standard's −200 … 850 °C
    }),
    { accumulatorBits: 32 as const },
  ],
] as const;
for (const [name, ch, extra] of issue) {
  const c = channelConstants(ch, { targetError: 0.01, ...extra });
  out.push(...rows(name, ch.unit, 0.01, c, c.codeMax - c.codeMin + 1));
}
const ntc = createSteinhartHartThermistor({ a: 1.129241e-3, b: 2.341077e-4, c: 8.775468e-8 });
const codeOf = (celsius: number) => {
  const R = ntc.ohmsAt(celsius);
  return Math.round(((R - 10000) / (2 * (R + 10000))) * 2 ** 23);
};
const ntcDesign = designFirmwareConstants({
  name: 'ntc',
  exact: (code) => ntc.temperatureAt((10000 * (1 + (2 * code) / 2 ** 23)) / (1 - (2 * code) / 2 ** 23)),
  referenceError: { bound: 2e-12, source: 'test' },
  codeMin: codeOf(80) + 1,
  codeMax: codeOf(-20) - 1,
  quantityUnit: '°C',
  targetError: 0.01,
  outputUnit: '0.001',
});
out.push(
  ...rows(
    '10 kΩ NTC −20 … 80 °C',
    '°C',
    0.01,
    { ...ntcDesign, totals: ntcDesign.totals ?? {} },
    codeOf(-20) - codeOf(80) - 1,
  ),
);
console.log(out.join('\n'));
