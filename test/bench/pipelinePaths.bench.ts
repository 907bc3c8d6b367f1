/**
 * The conversion pipeline's two paths for raw outputs, in one process on the same file: the lane
 * path (codes de-interleaved into lanes, each channel's `convert`, the per-lane clip count and
 * scaling, the writer's interleaving) against the interleaved path (the codes as read, the channel
 * package's interleaved converter, one pass into the writer's buffer). 4 × 10⁷ int32le codes in 8
 * channels (`--codes=N` to change), converted by `convertRecording` from the built `dist/` into
 * `createRawWriter` over a sink that discards the bytes (so the figure is the pipeline's, not the
 * disk's); alternating rounds, CPU time (user + system) per run, medians and the median of the
 * per-round ratios printed.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { createChannel, createInterleavedConverter, type ChannelSpec } from '@bridgework/channel';

const root = fileURLToPath(new URL('../../../', import.meta.url)); // .bench-build/test/bench → repo
const load = async (name: string): Promise<Record<string, unknown>> =>
  (await import(pathToFileURL(join(root, `packages/cli/dist/data/${name}.js`)).href)) as Record<
    string,
    unknown
  >;
type Convert = (options: Record<string, unknown>) => Promise<{ frames: number }>;
const convertRecording = (await load('convertRecording'))['convertRecording'] as Convert;
const openCodeSource = (await load('openCodeSource'))['openCodeSource'] as (
  file: string,
  options: Record<string, unknown>,
) => Promise<{ blockFrames: number }>;
const createRawWriter = (await load('createRawWriter'))['createRawWriter'] as (
  sink: unknown,
  format: string,
  channels: number,
  blockFrames: number,
) => unknown;

const flag = (name: string): number | undefined => {
  const a = process.argv.find((x) => x.startsWith(`--${name}=`));
  return a === undefined ? undefined : Number(a.slice(name.length + 3));
};
const short = process.argv.includes('--short');
const codes = flag('codes') ?? (short ? 800_000 : 40_000_000);
const rounds = short ? 1 : 5;
const channelCount = 8;

// Eight quarter-bridge strain channels on a 24-bit ratiometric converter (the invented rig of
// convert.bench.ts).
const spec = (gaugeFactor: number): ChannelSpec =>
  ({
    sensor: { kind: 'strain-gauge', gaugeFactor, gaugeOhms: 350 },
    bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 0.5 },
    excitation: { volts: 5 },
    amplifier: { gain: 128 },
    adc: { bits: 24, referenceVolts: 5, ratiometric: true, filter: { order: 3, dataRateHertz: 1000 } },
    output: { quantity: 'strain', unit: 'µε' },
  }) as ChannelSpec;
const channels = Array.from({ length: channelCount }, (_, j) => createChannel(spec(2 + j / 100)));

const dir = mkdtempSync(join(tmpdir(), 'bridgework-paths-bench-'));
process.on('exit', () => rmSync(dir, { recursive: true, force: true }));
const input = join(dir, 'rig.bin');
const data = new Int32Array(codes);
for (let i = 0; i < codes; i++) {
  data[i] = Math.round(2e6 * Math.sin(Math.floor(i / channelCount) / 5000 + (i % channelCount)));
}
writeFileSync(input, new Uint8Array(data.buffer));

const discard = { write: (): Promise<void> => Promise.resolve() };
const median = (xs: readonly number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 === 1
    ? (s[(s.length - 1) / 2] as number)
    : ((s[s.length / 2 - 1] as number) + (s[s.length / 2] as number)) / 2;
};

console.log(
  `convert paths: ${codes.toExponential(1)} int32le codes in ${channelCount} channels, ${rounds} rounds, CPU ms per run; load ${loadavg()
    .map((x) => x.toFixed(2))
    .join(' ')}`,
);
for (const format of ['float32le', 'float64le']) {
  const cpu = { lanes: [] as number[], frames: [] as number[] };
  for (let r = 0; r <= rounds; r++) {
    for (const mode of ['lanes', 'frames'] as const) {
      const source = await openCodeSource(input, { channels: channelCount });
      const writer = createRawWriter(discard, format, channelCount, source.blockFrames);
      const start = process.cpuUsage();
      await convertRecording({
        source,
        channels,
        writer,
        ...(mode === 'frames' ? { frameConverter: createInterleavedConverter(channels) } : {}),
      });
      const used = process.cpuUsage(start);
      if (r > 0) cpu[mode].push((used.user + used.system) / 1000); // round 0 warms up
    }
  }
  const ratio = median(cpu.frames.map((x, r) => x / (cpu.lanes[r] as number)));
  console.log(
    `${format}: lane path ${median(cpu.lanes).toFixed(0)} ms, interleaved path ${median(cpu.frames).toFixed(0)} ms (${((codes / median(cpu.frames)) * 1e-3).toFixed(0)} M codes/CPU s); interleaved / lanes ${ratio.toFixed(2)}`,
  );
}
