/**
 * The test day of examples/test-day, start to finish through the commands: design report, shunt
 * plan, shunt calibration written back, calibration against reference loads written back, and the
 * proof-load recording converted with what the day learned. Each step's figures are checked
 * against an independent calculation: closed-form shunt equations, a 40-digit nodal solve of the
 * shunted bridge with its leads, 40-digit normal equations of the fit, the load-cell error terms by
 * their definitions, and the loads and strains the recording was made from.
 */
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Decimal } from 'decimal.js';
import { evaluateCertificate, spanCorrectionFromShunt } from '@bridgework/calibration';
import { createChannel, type ChannelSpec } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { solveNetwork } from '../../../test/support/nodal.js';
import {
  proofLoadRecording,
  proofLoadRows,
  TIE_MICROSTRAIN_PER_KN,
} from '../../../examples/test-day/proofLoadRecording.js';
import { useTempDir } from './support/tempDir.js';
import { memoryIo } from './support/memoryIo.js';

const exampleDir = fileURLToPath(new URL('../../../examples/test-day/', import.meta.url));
const files = [
  'slipway-winch.yaml',
  'tie-shunt-readings.csv',
  'rope-calibration-points.csv',
  'proof-load-recording.csv',
];
const tmp = useTempDir('test-day');
const env = { SOURCE_DATE_EPOCH: '1796342400', NO_COLOR: '1' }; // 2026-12-04

async function run(...argv: string[]) {
  const io = memoryIo({ env });
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });

/** One lead of 25 m of AWG 24 copper at 20 °C: ASTM B258 d = 0.127 mm·92^((36 − n)/39); IEC 60028 ρ = 1/58 Ω·mm²/m. */
const leadOhms = (() => {
  const d = 0.127 * 92 ** ((36 - 24) / 39);
  return (25 * (1 / 58)) / ((Math.PI / 4) * d * d);
})();

/**
 * The output ratio of the tie's quarter bridge (350 Ω gauge in arm 1, three-wire, completion
 * 350 Ω) with a shunt across the gauge, by a 40-digit nodal solve of the whole circuit: lead 1 from
 * E+ to the gauge, lead 2 from the gauge to the completion resistor of arm 2, lead 3 (sense) from
 * the gauge to the instrument's S− terminal; ideal meter (the bridge equations and Ohm's law).
 */
function tieRatioNodal(shuntOhms: number): number {
  const s = solveNetwork({
    ground: 'EM',
    sources: [{ plus: 'EP', minus: 'EM', volts: 1 }],
    resistors: [
      { a: 'EP', b: 'GA', ohms: leadOhms },
      { a: 'GA', b: 'GB', ohms: 350 },
      { a: 'GA', b: 'GB', ohms: shuntOhms },
      { a: 'GB', b: 'Y', ohms: leadOhms },
      { a: 'Y', b: 'EM', ohms: 350 },
      { a: 'GB', b: 'SM', ohms: leadOhms },
      { a: 'EM', b: 'SP', ohms: 350 },
      { a: 'SP', b: 'EP', ohms: 350 },
    ],
  });
  return s.volts('SP').minus(s.volts('SM')).toNumber();
}

/** Solves A·x = b (n ≤ 4) by Gaussian elimination with partial pivoting, in 40 digits. */
function solveDecimal(a: Decimal[][], b: Decimal[]): Decimal[] {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i] as Decimal]);
  for (let k = 0; k < n; k++) {
    let p = k;
    for (let i = k + 1; i < n; i++) if (m[i]![k]!.abs().gt(m[p]![k]!.abs())) p = i;
    [m[k], m[p]] = [m[p]!, m[k]!];
    for (let i = k + 1; i < n; i++) {
      const f = m[i]![k]!.div(m[k]![k]!);
      for (let j = k; j <= n; j++) m[i]![j] = m[i]![j]!.minus(f.times(m[k]![j]!));
    }
  }
  const x = new Array<Decimal>(n);
  for (let i = n - 1; i >= 0; i--) {
    let s = m[i]![n]!;
    for (let j = i + 1; j < n; j++) s = s.minus(m[i]![j]!.times(x[j]!));
    x[i] = s.div(m[i]![i]!);
  }
  return x;
}

describe('the test day of examples/test-day', () => {
  const dir = () => tmp();
  const at = (name: string) => join(dir(), name);

  it('starts from the example files (the recording is the one the scenario makes)', () => {
    if (process.env['BRIDGEWORK_WRITE_EXAMPLES'] === '1')
      writeFileSync(join(exampleDir, 'proof-load-recording.csv'), proofLoadRecording());
    for (const f of files) copyFileSync(join(exampleDir, f), at(f));
    expect(readFileSync(at('proof-load-recording.csv'), 'utf8')).toBe(proofLoadRecording());
  });

  it('1. design report of both channels', async () => {
    const r = await run('report', at('slipway-winch.yaml'));
    expect(r.code).toBe(exitCodes.ok);
    expect(r.stdout).toMatch(/^rope: force \(kN\)$/m);
    expect(r.stdout).toMatch(/^tie: strain \(µε\)$/m);
  });

  it('2. shunt plan: the resistors by the closed forms, the steps by a nodal solve of the bridge', async () => {
    const text = await run('shunt-plan', at('slipway-winch.yaml'));
    expect(text.code).toBe(exitCodes.ok);
    await expect(text.stdout.replaceAll(dir(), '<dir>')).toMatchFileSnapshot(
      './__snapshots__/test-day-shunt-plan.txt',
    );

    const r = await run('shunt-plan', at('slipway-winch.yaml'), '--json');
    const plans = JSON.parse(r.stdout).plans as {
      channel: string;
      simulate: number;
      exact: {
        shuntOhms: number;
        shuntedRatio: number;
        zeroRatio: number;
        stepCodes: number;
        indicated: number;
      };
      preferred: { shuntOhms: number; shuntedRatio: number; zeroRatio: number; stepCodes: number };
    }[];
    const [rope, tie] = plans as [(typeof plans)[0], (typeof plans)[0]];
    // Default: 80 % of the span's larger end, downwards for arm 1.
    expect(rope.simulate).toBeNear(-40, { rel: 1e-15 });
    expect(tie.simulate).toBeNear(-1200, { rel: 1e-15 });
    // Full bridge of four equal arms: Δr = −R/(2(R + 2Rs)) (from Vout/E = (R1R3 − R2R4)/((R1 + R2)(R3 + R4))),
    // so Rs = (R/(2|Δr|) − R)/2 with Δr = 40/50 of 2 mV/V; six-wire leads do not enter.
    expect(rope.exact.shuntOhms).toBeNear((350 / (2 * 1.6e-3) - 350) / 2, { rel: 1e-9 });
    expect(rope.exact.indicated).toBeNear(-40, { rel: 1e-9 });
    // Quarter bridge, shunt across the gauge: Rs = Rg/(GF·|ε|) − Rg (resistance-equivalent strain,
    // common practice); the exact inverse of the bridge gives the same strain for a gauge in arm 1.
    expect(tie.exact.shuntOhms).toBeNear(350 / (2.08 * 1.2e-3) - 350, { rel: 1e-9 });
    expect(tie.exact.indicated).toBeNear(-1200, { rel: 1e-9 });
    // E96 (IEC 60063): 1.40 and 5.49 are E96 values (from memory).
    expect(tie.preferred.shuntOhms).toBe(140_000);
    expect(rope.preferred.shuntOhms).toBe(54_900);
    // The shunted bridge, solved node by node with its three leads: the step in V/V and in codes
    // (ratiometric 24-bit converter at gain 128: code = ratio·128·2^23).
    const nodal = tieRatioNodal(140_000);
    expect(tie.preferred.shuntedRatio - tie.preferred.zeroRatio).toBeNear(nodal, { rel: 1e-12 });
    expect(tie.preferred.stepCodes).toBeNear(nodal * 128 * 2 ** 23, { rel: 1e-12 });
    // The rope: Δr = −R/(2(R + 2Rs)) for 54.9 kΩ, code = ratio·64·2^23.
    const dr = -350 / (2 * (350 + 2 * 54_900));
    expect(rope.preferred.stepCodes).toBeNear(dr * 64 * 2 ** 23, { rel: 1e-12 });
  });

  it('3. shunt calibration of the tie: span factor from the readings, written back keeping the file', async () => {
    const before = readFileSync(at('slipway-winch.yaml'), 'utf8');
    const args = ['shunt-apply', at('slipway-winch.yaml'), '--channel', 'tie', '--shunt-ohms', '140000'];
    const json = await run(...args, '--readings', at('tie-shunt-readings.csv'), '--json');
    expect(json.code).toBe(exitCodes.ok);
    const a = JSON.parse(json.stdout);
    // The same figures from the calibration package, with the step from the nodal solve.
    const rows = readFileSync(at('tie-shunt-readings.csv'), 'utf8')
      .split('\n')
      .filter((l) => /^with(out)?,/.test(l))
      .map((l) => l.split(','));
    const zero = rows.filter((r) => r[0] === 'without').map((r) => Number(r[1]));
    const shunted = rows.filter((r) => r[0] === 'with').map((r) => Number(r[1]));
    const want = spanCorrectionFromShunt({
      expectedStep: tieRatioNodal(140_000) * 128 * 2 ** 23,
      zeroReadings: zero,
      shuntedReadings: shunted,
    }).value;
    expect(a.factor).toBeNear(want.factor, { rel: 1e-12 });
    expect(a.factorStandardUncertainty).toBeNear(want.factorStandardUncertainty as number, { rel: 1e-9 });
    expect(a.spanErrorFraction).toBeNear(want.spanErrorFraction, { rel: 1e-9 });
    expect(a.measured.stepCodes).toBeNear(
      shunted.reduce((s, x) => s + x, 0) / 10 - zero.reduce((s, x) => s + x, 0) / 10,
      {
        rel: 1e-12,
      },
    );
    // The scenario's tie reads 0.9962 of its model: the shunt finds it within its noise.
    expect(1 / a.factor).toBeNear(0.9962, { rel: 2e-5 });
    expect(a.written).toBe(false);
    expect(readFileSync(at('slipway-winch.yaml'), 'utf8')).toBe(before);

    const text = await run(...args, '--readings', at('tie-shunt-readings.csv'), '--write');
    expect(text.code).toBe(exitCodes.ok);
    await expect(text.stdout.replaceAll(dir(), '<dir>')).toMatchFileSnapshot(
      './__snapshots__/test-day-shunt-apply.txt',
    );
    const after = readFileSync(at('slipway-winch.yaml'), 'utf8');
    // Every line of the file is kept, in order; the section is added under the channel.
    expectLinesKept(before, after);
    expect(after).toMatch(
      /\n {4}# span correction from a shunt calibration \(bridgework shunt-apply, 2026-12-04\)\n {4}spanCorrection:\n {6}factor: /,
    );
  });

  it('4. calibration of the rope against reference loads: the fit by 40-digit normal equations, the error terms by their definitions', async () => {
    const before = readFileSync(at('slipway-winch.yaml'), 'utf8');
    const args = [
      'fit-calibration',
      at('slipway-winch.yaml'),
      at('rope-calibration-points.csv'),
      '--channel',
      'rope',
      '--degree',
      '2',
    ];
    const r = await run(...args, '--json');
    expect(r.code).toBe(exitCodes.ok);
    const fit = JSON.parse(r.stdout);
    const points = readFileSync(at('rope-calibration-points.csv'), 'utf8')
      .split('\n')
      .filter((l) => /^\d/.test(l))
      .map((l) => l.split(','))
      .map(([load, code, direction, cycle]) => ({
        load: Number(load),
        // Ratiometric 24-bit converter at gain 64, no span correction: ratio = code/(64·2^23).
        ratio: Number(code) / (64 * 2 ** 23),
        direction: direction as 'up' | 'down',
        cycle: Number(cycle),
      }));
    expect(fit.points).toHaveLength(points.length);
    // Normal equations AᵀA·c = Aᵀy in 40 digits (the fit itself uses QR in doubles).
    const A = points.map((p) => [new D(1), new D(p.load), new D(p.load).pow(2)]);
    const y = points.map((p) => new D(p.ratio));
    const ata = [0, 1, 2].map((i) =>
      [0, 1, 2].map((j) => A.reduce((s, row) => s.plus(row[i]!.times(row[j]!)), new D(0))),
    );
    const aty = [0, 1, 2].map((i) => A.reduce((s, row, k) => s.plus(row[i]!.times(y[k]!)), new D(0)));
    const c = solveDecimal(ata, aty);
    c.forEach((ck, k) => expect(fit.coefficients[k]).toBeNear(ck.toNumber(), { rel: 1e-9 }));
    // Covariance s²·(AᵀA)⁻¹ with s² = Σ residual²/(n − 3) (JCGM 100 H.3, generalised).
    const residuals = points.map((p, k) =>
      y[k]!.minus(c[0]!.plus(c[1]!.times(p.load)).plus(c[2]!.times(p.load ** 2))),
    );
    const s2 = residuals.reduce((s, e) => s.plus(e.pow(2)), new D(0)).div(points.length - 3);
    for (let j = 0; j < 3; j++) {
      const col = solveDecimal(
        ata,
        [0, 1, 2].map((i) => new D(i === j ? 1 : 0)),
      );
      col.forEach((v, i) => expect(fit.covariance[i][j]).toBeNear(v.times(s2).toNumber(), { rel: 1e-7 }));
    }
    // OIML R 60 error terms (clause 3, terminology; from memory), computed here from their
    // definitions: nonlinearity of the mean loading curve against the terminal line; hysteresis as
    // unloading minus loading mean at one load; repeatability as the spread over the cycles.
    const meanAt = (load: number, direction: string) => {
      const xs = points.filter((p) => p.load === load && p.direction === direction).map((p) => p.ratio);
      return xs.reduce((s, x) => s + x, 0) / xs.length;
    };
    const loads = [0, 10, 20, 30, 40, 50];
    const span = meanAt(50, 'up') - meanAt(0, 'up');
    const deviation = loads.map((q) => meanAt(q, 'up') - (meanAt(0, 'up') + (span * q) / 50));
    const worst = (xs: number[]) => xs.reduce((w, x) => (Math.abs(x) > Math.abs(w) ? x : w), 0);
    expect(fit.nonlinearity.value).toBeNear(worst(deviation), { rel: 1e-9 });
    expect(fit.nonlinearity.load).toBeNear((worst(deviation) / span) * 50, { rel: 1e-9 });
    const hysteresis = loads.slice(0, 5).map((q) => meanAt(q, 'down') - meanAt(q, 'up'));
    expect(fit.hysteresis.value).toBeNear(worst(hysteresis), { rel: 1e-9 });
    const spreads = ['up', 'down'].flatMap((d) =>
      loads.map((q) => {
        const xs = points.filter((p) => p.load === q && p.direction === d).map((p) => p.ratio);
        return xs.length < 2 ? 0 : Math.max(...xs) - Math.min(...xs);
      }),
    );
    expect(fit.repeatability.value).toBeNear(Math.max(...spreads), { rel: 1e-9 });
    // The same nonlinearity and hysteresis from the calibration package's certificate evaluation
    // (its fractions of rated output), the unloading run reaching capacity at the loading reading.
    const runs = [1, 2].map((cycle) => {
      const at1 = (q: number, d: string) =>
        points.find((p) => p.cycle === cycle && p.load === q && p.direction === d)!.ratio;
      return {
        ascending: loads.map((q) => at1(q, 'up')),
        descending: loads.map((q) => (q === 50 ? at1(q, 'up') : at1(q, 'down'))),
      };
    });
    const certificate = evaluateCertificate({ loads, runs });
    expect(Math.abs(fit.nonlinearity.fractionOfSpan)).toBeNear(certificate.terminalNonlinearityFraction, {
      rel: 1e-9,
    });
    expect(Math.abs(fit.hysteresis.fractionOfSpan)).toBeNear(certificate.hysteresisFraction as number, {
      rel: 1e-9,
    });
    expect(readFileSync(at('slipway-winch.yaml'), 'utf8')).toBe(before);

    const text = await run(...args, '--write');
    expect(text.code).toBe(exitCodes.ok);
    await expect(text.stdout.replaceAll(dir(), '<dir>')).toMatchFileSnapshot(
      './__snapshots__/test-day-fit-calibration.txt',
    );
    const after = readFileSync(at('slipway-winch.yaml'), 'utf8');
    expectLinesKept(before, after);
    expect(after).toMatch(/\n {4}calibration:\n {6}unit: kN\n {6}coefficients: \[/);
    expect(after).toMatch(/\n {6}pointsFile: rope-calibration-points\.csv\n/);
  });

  it('5. the proof-load recording converts, through what the day wrote, to the loads and strains it was made from', async () => {
    const out = at('proof-load.csv');
    const r = await run(
      'convert',
      at('slipway-winch.yaml'),
      at('proof-load-recording.csv'),
      '--columns',
      'rope,tie',
      '--channels',
      'rope,tie',
      '-o',
      out,
    );
    expect(r.code, r.stderr).toBe(exitCodes.ok);
    const lines = readFileSync(out, 'utf8').trim().split('\n');
    const header = lines[0]!.split(',');
    const ropeAt = header.findIndex((h) => h.startsWith('rope'));
    const tieAt = header.findIndex((h) => h.startsWith('tie'));
    const rows = proofLoadRows();
    expect(lines).toHaveLength(rows.length + 1);
    rows.forEach((row, i) => {
      const cells = lines[i + 1]!.split(',');
      // The calibration's error is the load cell's own (half its hysteresis, its bow against the
      // quadratic): within 0.01 kN, 0.02 % of the span.
      expect(Number(cells[ropeAt])).toBeNear(row.force, { abs: 0.01 });
      // The span correction undoes the tie's gain error to the noise of the shunt readings
      // (u(k)/k ≈ 4e-6) and the rounding of the codes to integers (half a code).
      expect(Number(cells[tieAt])).toBeNear(TIE_MICROSTRAIN_PER_KN * row.force, { rel: 2e-5, abs: 0.002 });
    });
  });
});

describe('shunt calibration round trip', () => {
  it('simulate a strain, measure the step on a channel with a gain error, correct the span, convert: the strain comes back within 1e-9', async () => {
    const spec: ChannelSpec = {
      sensor: { kind: 'strain-gauge', gaugeFactor: 2.08, gaugeOhms: 350 },
      bridge: { arrangement: 'quarter', wiring: 'three-wire', ohmsPerLead: 2.1 },
      excitation: { volts: 2.5 },
      amplifier: { gain: 128 },
      adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
      output: { quantity: 'strain', unit: 'µε', range: [-1500, 1500] },
    };
    const g = 0.99137; // the real gain relative to the model
    const truth = createChannel({ ...spec, amplifier: { gain: 128 * g } });
    const file = join(tmp(), 'round-trip.yaml');
    writeFileSync(
      file,
      [
        '# a quarter bridge with a gain error the model does not know',
        'channels:',
        '  g:',
        '    sensor: { kind: strain-gauge, gaugeFactor: 2.08, gaugeOhms: 350 }',
        '    bridge: { arrangement: quarter, wiring: three-wire, ohmsPerLead: 2.1 }',
        '    excitation: { volts: 2.5 }',
        '    amplifier: { gain: 128 }',
        '    adc: { bits: 24, referenceVolts: 2.5, ratiometric: true }',
        '    output: { quantity: strain, unit: µε, range: [-1500, 1500] }',
        '',
      ].join('\n'),
    );
    // The measured step: the true channel's codes without and with 140 kΩ across the gauge, from the
    // nodal solve (leads 2.1 Ω), unrounded (an averaged reading).
    const shunted = solveNetwork({
      ground: 'EM',
      sources: [{ plus: 'EP', minus: 'EM', volts: 1 }],
      resistors: [
        { a: 'EP', b: 'GA', ohms: 2.1 },
        { a: 'GA', b: 'GB', ohms: 350 },
        { a: 'GA', b: 'GB', ohms: 140_000 },
        { a: 'GB', b: 'Y', ohms: 2.1 },
        { a: 'Y', b: 'EM', ohms: 350 },
        { a: 'GB', b: 'SM', ohms: 2.1 },
        { a: 'EM', b: 'SP', ohms: 350 },
        { a: 'SP', b: 'EP', ohms: 350 },
      ],
    });
    const ratio = shunted.volts('SP').minus(shunted.volts('SM')).toNumber();
    const counts = 128 * g * 2 ** 23;
    const r = await run(
      'shunt-apply',
      file,
      '--shunt-ohms',
      '140000',
      '--zero-code',
      '0',
      '--shunted-code',
      String(ratio * counts),
      '--write',
    );
    expect(r.code, r.stderr).toBe(exitCodes.ok);
    const corrected = (await loadChannels(file)).channels[0]!.channel;
    expect(corrected.spec.spanCorrection?.factor).toBeNear(1 / g, { rel: 1e-12 });
    for (const e of [-1450, -700, -1.5, 3, 250, 1200, 1490]) {
      expect(corrected.quantityFromCode(truth.exactCodeFromQuantity(e))).toBeNear(e, { rel: 1e-9 });
    }
  });
});

function expectLinesKept(before: string, after: string): void {
  const lines = after.split('\n');
  let i = 0;
  for (const line of before.split('\n')) {
    while (i < lines.length && lines[i] !== line) i++;
    expect(i, `line '${line}' is kept`).toBeLessThan(lines.length);
    i++;
  }
}
