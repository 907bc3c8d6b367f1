/**
 * Corrections taken from the data, end to end through `bridgework convert`, on a synthetic
 * recording of the demo file's gusset strain gauge and deck RTD:
 *
 * - the gauge's codes are the channel's own map at each block's true temperature, inverted by
 *   bisection (the nearest code to the strain), on a staircase ramp 8 → 23 °C (the thermal output
 *   alone moves the unloaded reading by several µε), plus a known zero drift of 1500 codes; no
 *   load for 30 s, 500 µε after;
 * - the RTD's codes are its forward map at the same temperatures.
 *
 * Hand computation of what the command must write: the zero reading is the mean gusset code over
 * the first 10 s, the zero temperature the RTD's reading of its mean code over that window, each
 * block's temperature the mean of the RTD's readings in the block; the gusset is then the channel
 * with that zero reading converted at that temperature (bit for bit). Physically: the corrected
 * strain is 0 µε before the load and 500 µε after, whatever the temperature, within 0.05 µε
 * (quantization of the codes: 0.0035 µε per code).
 */
import { readFileSync } from 'node:fs';
import { createChannel, type ChannelSpec } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { exampleShown, footbridgeSpecs } from './support/footbridge.js';
import { int32le, useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { file, outPath } = useTestFiles('corrections');
const RATE = 10; // frames per second
const BLOCK = 50; // frames per block (5 s)
const FRAMES = 600;
const DRIFT = 1500; // codes
const LOAD_FROM = 300; // frame
const LOAD = 500; // µε

const gussetSpec = footbridgeSpecs['gusset-g2'];
const deck = createChannel(footbridgeSpecs['deck-temp']);
/** The block's true temperature: 8 °C for the first two blocks (the zero window), then +1.5 K per block. */
const trueTemperature = (block: number): number => (block <= 1 ? 8 : 8 + 1.5 * (block - 1));

/** The gauge zeroed at 8 °C without a zero reading: the forward model of the recording. */
const { zero: _zero, ...unzeroed } = gussetSpec;
const forward = createChannel({
  ...unzeroed,
  environment: { ...gussetSpec.environment, zeroTemperatureCelsius: 8 },
} as ChannelSpec);

/** The code whose value at temperature t is nearest to ε (bisection on the channel's own map at t). */
function codeAt(t: number, e: number): number {
  const value = (c: number): number =>
    forward.convert(Int32Array.of(c), undefined, { temperatureCelsius: t }).values[0] as number;
  let lo = Math.floor(forward.validCodes.min) + 1;
  let hi = Math.ceil(forward.validCodes.max) - 1;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (value(mid) < e) lo = mid;
    else hi = mid;
  }
  return Math.abs(value(lo) - e) <= Math.abs(value(hi) - e) ? lo : hi;
}

function recording(): { codes: Int32Array; strain: number[] } {
  const codes = new Int32Array(FRAMES * 2);
  const strain: number[] = [];
  for (let f = 0; f < FRAMES; f++) {
    const t = trueTemperature(Math.floor(f / BLOCK));
    const e = f >= LOAD_FROM ? LOAD : 0;
    strain.push(e);
    codes[2 * f] = codeAt(t, e) + DRIFT;
    codes[2 * f + 1] = deck.codeFromQuantity(t);
  }
  return { codes, strain };
}

async function convert(input: string, extra: string[]): Promise<{ rows: number[][]; stderr: string }> {
  const io = memoryIo();
  const out = outPath('out.csv');
  const argv = [
    'convert',
    exampleShown,
    input,
    '--channels',
    'gusset-g2,deck-temp',
    '--block',
    String(BLOCK),
    '-o',
    out,
  ];
  const code = await runCli([...argv, ...extra], io);
  expect(code, io.stderr.text()).toBe(exitCodes.ok);
  const rows = readFileSync(out, 'utf8')
    .trim()
    .split('\n')
    .slice(1)
    .map((l) => l.split(',').map(Number));
  return { rows, stderr: io.stderr.text() };
}

describe('re-zero from a window and temperature from a channel of the recording', () => {
  const { codes, strain } = recording();
  const input = file('drift.bin', int32le([...codes]));

  it('without corrections the drift and the thermal output show', async () => {
    const { rows } = await convert(input, []);
    const first = rows[0]?.[0] as number;
    const beforeLoad = rows.slice(0, LOAD_FROM).map((r) => r[0] as number);
    // The file's own zero reading (code −18433) is not this recording's: the drift shows.
    expect(Math.abs(first)).toBeGreaterThan(1); // µε, far above the 0.0035 µε of a code
    // Over the ramp the thermal output alone moves the unloaded reading by tens of µε.
    expect(Math.max(...beforeLoad) - Math.min(...beforeLoad)).toBeGreaterThan(5);
  });

  it('equals the hand computation bit for bit, and reads the true strain within 0.05 µε', async () => {
    const { rows, stderr } = await convert(input, [
      '--sample-rate',
      String(RATE),
      '--zero-window',
      '10s',
      '--temperature-from',
      'deck-temp',
    ]);
    // Hand computation. The zero window is frames 0–99 (t < 10 s at 10 frames/s).
    const windowGusset = Array.from({ length: 100 }, (_, f) => codes[2 * f] as number);
    const windowDeck = Array.from({ length: 100 }, (_, f) => codes[2 * f + 1] as number);
    const zeroCode = windowGusset.reduce((a, b) => a + b) / 100; // integers: the sum is exact
    const zeroTemperature = deck.quantityFromCode(windowDeck.reduce((a, b) => a + b) / 100);
    const rezeroed = createChannel({
      ...gussetSpec,
      zero: { code: zeroCode },
      environment: { ...gussetSpec.environment, zeroTemperatureCelsius: zeroTemperature },
    });
    expect(stderr).toContain(`zero readings from frames 0 to 99: gusset-g2 ${zeroCode}`);
    for (let b = 0; b < FRAMES / BLOCK; b++) {
      const frames = Array.from({ length: BLOCK }, (_, k) => b * BLOCK + k);
      // The block temperature is the mean of the temperature channel's converted values.
      const temps = frames.map(
        (f) => deck.convert(Int32Array.of(codes[2 * f + 1] as number)).values[0] as number,
      );
      let sum = 0;
      for (const t of temps) sum += t;
      const blockTemperature = sum / BLOCK;
      const laneCodes = Int32Array.from(frames, (f) => codes[2 * f] as number);
      const want = rezeroed.convert(laneCodes, undefined, { temperatureCelsius: blockTemperature }).values;
      frames.forEach((f, k) => {
        expect(Object.is(rows[f]?.[0], want[k]), `frame ${f}: ${rows[f]?.[0]} vs ${want[k]}`).toBe(true);
        expect(rows[f]?.[1]).toBe(deck.convert(Int32Array.of(codes[2 * f + 1] as number)).values[0]);
        // Physics: the true strain, through the drift and the whole ramp.
        expect(rows[f]?.[0] as number).toBeNear(strain[f] as number, { abs: 0.05 });
      });
    }
  });

  it('refuses to zero a temperature channel, and a window without frames', async () => {
    const io = memoryIo();
    const base = ['convert', exampleShown, input, '--channels', 'gusset-g2,deck-temp', '--sample-rate', '10'];
    expect(await runCli([...base, '--zero-window', '1s', '--zero-channels', 'deck-temp'], io)).toBe(
      exitCodes.badInput,
    );
    expect(io.stderr.text()).toMatch(
      /'deck-temp' is a temperature channel: its reading is absolute and has no zero/,
    );
    const late = memoryIo();
    expect(await runCli([...base, '--zero-window', '100s..200s'], late)).toBe(exitCodes.badInput);
    expect(late.stderr.text()).toMatch(/the window 100 s to 200 s holds no frame/);
    const noRate = memoryIo();
    expect(
      await runCli(
        ['convert', exampleShown, input, '--channels', 'gusset-g2,deck-temp', '--zero-window', '1s'],
        noRate,
      ),
    ).toBe(exitCodes.badInput);
    expect(noRate.stderr.text()).toMatch(/a time window needs the frames' times: give the sample rate/);
    const notTemp = memoryIo();
    expect(await runCli([...base, '--temperature-from', 'gusset-g2'], notTemp)).toBe(exitCodes.badInput);
    expect(notTemp.stderr.text()).toMatch(/'gusset-g2' measures strain, not temperature/);
  });
});
