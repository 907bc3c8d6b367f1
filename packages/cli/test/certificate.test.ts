/**
 * `bridgework check-certificate` on the test day's rope load cell certificate
 * (examples/test-day/rope-certificate.csv): every figure recomputed here from the file by the
 * definitions, and the maximum permissible errors from the OIML R 60 table written out by hand
 * (class C, pLC 0.7: 0.35 v up to 500 v, 0.70 v up to 2000 v, 1.05 v above; the class C values
 * quoted from R 60-1:2021 Table 4 in the calibration package). Creep limits 0.7 × mpe over 30 min
 * and 0.15 × mpe from 20 to 30 min, the minimum dead load output return 0.5 v, the zero against
 * temperature pLC × vmin per 5 K (OIML R 60; from memory).
 */
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { evaluateCertificate } from '@bridgework/calibration';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { memoryIo } from './support/memoryIo.js';
import { useTempDir } from './support/tempDir.js';

const exampleDir = fileURLToPath(new URL('../../../examples/test-day/', import.meta.url));
const tmp = useTempDir('certificate');
const env = { SOURCE_DATE_EPOCH: '1796342400', NO_COLOR: '1' };

async function run(...argv: string[]) {
  const io = memoryIo({ env });
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

function copyExample(): { yaml: string; cert: string } {
  const dir = tmp();
  for (const f of ['slipway-winch.yaml', 'rope-certificate.csv'])
    copyFileSync(join(exampleDir, f), join(dir, f));
  return { yaml: join(dir, 'slipway-winch.yaml'), cert: join(dir, 'rope-certificate.csv') };
}

interface Row {
  test: string;
  t: number;
  cycle: number;
  dir: string;
  load: number;
  r: number;
  minutes: number;
}
function readRows(file: string): Row[] {
  const lines = readFileSync(file, 'utf8')
    .split('\n')
    .filter((l) => l.trim() !== '' && !l.startsWith('#'))
    .slice(1);
  return lines.map((l) => {
    const [test, t, cycle, dir, load, r, minutes] = l.split(',');
    return {
      test: test!,
      t: Number(t),
      cycle: Number(cycle),
      dir: dir!,
      load: Number(load),
      r: Number(r) / 1000,
      minutes: Number(minutes),
    };
  });
}
const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;

const C3 = ['--class', 'C', '--intervals', '3000', '--capacity-per-vmin', '10000'];

describe('check-certificate on the rope load cell', () => {
  it('every error, limit and check against the definitions computed from the file', async () => {
    const { yaml, cert } = copyExample();
    const r = await run('check-certificate', yaml, cert, '-c', 'rope', ...C3, '--json');
    expect(r.stderr).toBe('');
    expect(r.code).toBe(exitCodes.ok);
    const j = JSON.parse(r.stdout);
    expect(j.caution).toMatch(/do not replace, qualified engineering judgement/);
    const rows = readRows(cert);
    // Runs: consecutive blocks of loading rows at one temperature.
    const runs: Row[][] = [];
    for (const row of rows.filter((x) => x.test === 'load')) {
      if (runs.length === 0 || runs[runs.length - 1]![0]!.t !== row.t) runs.push([]);
      runs[runs.length - 1]!.push(row);
    }
    expect(runs.map((x) => x[0]!.t)).toEqual([20, 40, -10, 20]);
    const upMean = (run: Row[], q: number) =>
      mean(run.filter((x) => x.dir === 'up' && x.load === q).map((x) => x.r));
    const S = (upMean(runs[0]!, 50) - upMean(runs[0]!, 0)) / 50; // V/V per kN
    const v = 50 / 3000;
    const mpe = (q: number) => {
      const m = q / v;
      return 0.7 * (m <= 500 ? 0.5 : m <= 2000 ? 1 : 1.5) * v;
    };
    expect(j.verificationInterval).toBeNear(v, { rel: 1e-15 });
    expect(j.vmin).toBeNear(50 / 10000, { rel: 1e-15 });
    const expected = runs.flatMap((run, i) =>
      run.map((x) => ({
        run: i,
        load: x.load,
        error: (x.r - upMean(run, 0)) / S - x.load,
        mpe: mpe(x.load),
      })),
    );
    expect(j.errors).toHaveLength(expected.length);
    expected.forEach((e, i) => {
      const got = j.errors[i];
      expect(got.run).toBe(e.run);
      expect(got.load).toBe(e.load);
      expect(got.error).toBeNear(e.error, { abs: 1e-12 });
      expect(got.mpe).toBeNear(e.mpe, { rel: 1e-14 });
      expect(got.ok).toBe(Math.abs(e.error) <= e.mpe);
    });
    const byName = (name: string) => j.checks.find((c: { name: string }) => c.name === name);
    // Load cell error per run: the largest share of the mpe.
    runs.forEach((run, i) => {
      const label = i === 3 ? '20 °C (2)' : `${run[0]!.t} °C`;
      const mine = expected.filter((e) => e.run === i);
      const worst = mine.reduce((a, b) => (Math.abs(b.error) / b.mpe > Math.abs(a.error) / a.mpe ? b : a));
      const c = byName(`load cell error, ${label}`);
      expect(c.value).toBeNear(Math.abs(worst.error), { abs: 1e-12 });
      expect(c.limit).toBeNear(worst.mpe, { rel: 1e-14 });
      // Repeatability: the spread over the three cycles of one load and direction.
      let best = { share: -1, value: 0, limit: 0 };
      for (const q of [0, 10, 20, 30, 40, 50])
        for (const d of ['up', 'down']) {
          const xs = run.filter((x) => x.load === q && x.dir === d).map((x) => x.r / S);
          if (xs.length < 2) continue;
          const value = Math.max(...xs) - Math.min(...xs);
          if (value / mpe(q) > best.share) best = { share: value / mpe(q), value, limit: mpe(q) };
        }
      const rep = byName(`repeatability, ${label}`);
      expect(rep.value).toBeNear(best.value, { abs: 1e-12 });
      expect(rep.limit).toBeNear(best.limit, { rel: 1e-14 });
    });
    // Creep at 50 kN.
    const creep = rows.filter((x) => x.test === 'creep');
    const at = (m: number) => creep.find((x) => x.minutes === m)!.r / S;
    const c30 = Math.max(...creep.map((x) => Math.abs(x.r / S - at(0))));
    expect(byName('creep over 30 min').value).toBeNear(c30, { abs: 1e-12 });
    expect(byName('creep over 30 min').limit).toBeNear(0.7 * 1.05 * v, { rel: 1e-14 });
    expect(byName('creep 20 to 30 min').value).toBeNear(Math.abs(at(30) - at(20)), { abs: 1e-12 });
    expect(byName('creep 20 to 30 min').limit).toBeNear(0.15 * 1.05 * v, { rel: 1e-14 });
    // Minimum dead load output return.
    const back = rows.filter((x) => x.test === 'return');
    expect(byName('minimum dead load output return').value).toBeNear(Math.abs(back[1]!.r - back[0]!.r) / S, {
      abs: 1e-12,
    });
    expect(byName('minimum dead load output return').limit).toBeNear(0.5 * v, { rel: 1e-15 });
    // The zero against temperature: consecutive runs, scaled to 5 K, against pLC·vmin.
    let zt = 0;
    for (let i = 1; i < runs.length; i++) {
      const dz = Math.abs(upMean(runs[i]!, 0) - upMean(runs[i - 1]!, 0)) / S;
      zt = Math.max(zt, (dz * 5) / Math.abs(runs[i]![0]!.t - runs[i - 1]![0]!.t));
    }
    expect(byName('zero against temperature, per 5 K').value).toBeNear(zt, { abs: 1e-12 });
    expect(byName('zero against temperature, per 5 K').limit).toBeNear(0.7 * 0.005, { rel: 1e-15 });
    expect(j.checks.every((c: { ok: boolean; margin: number }) => c.ok && c.margin >= 0)).toBe(true);
    // The characteristics, and the calibration package's certificate figures of the 20 °C run.
    expect(j.characteristics.sensitivity).toBeNear(S, { rel: 1e-14 });
    expect(j.characteristics.zeroBalanceVoltsPerVolt).toBeNear(upMean(runs[0]!, 0), { rel: 1e-14 });
    const loads = [0, 10, 20, 30, 40, 50];
    const ref = runs[0]!;
    const reading = (c: number, d: string, q: number) =>
      (ref.find((x) => x.cycle === c && x.dir === d && x.load === q) ??
        ref.find((x) => x.cycle === c && x.dir === 'up' && x.load === q))!.r;
    const library = evaluateCertificate({
      loads,
      runs: [1, 2, 3].map((c) => ({
        ascending: loads.map((q) => reading(c, 'up', q)),
        descending: loads.map((q) => reading(c, 'down', q)),
      })),
    });
    expect(j.characteristics.certificate.ratedOutput).toBeNear(library.ratedOutput, { rel: 1e-15 });
    expect(j.characteristics.certificate.hysteresisFraction).toBeNear(library.hysteresisFraction!, {
      rel: 1e-15,
    });
    expect(j.sensor).toBeUndefined();
    expect(j.written).toBe(false);
  });

  it('text report (golden) and the HTML page with the envelope', async () => {
    const { yaml, cert } = copyExample();
    const html = join(tmp(), 'certificate.html');
    const r = await run('check-certificate', yaml, cert, '-c', 'rope', ...C3, '--html', html);
    expect(r.code).toBe(exitCodes.ok);
    await expect(r.stdout.replaceAll(tmp(), '<dir>')).toMatchFileSnapshot(
      './__snapshots__/test-day-check-certificate.txt',
    );
    const page = readFileSync(html, 'utf8');
    // 4 runs (loading then unloading), and the two envelope lines.
    expect(page).toMatch(/data-plot="certificate-errors"[^>]*data-series-count="6"/);
    expect(page).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
  });

  it('--write puts the characteristics into the sensor section and keeps the rest of the file', async () => {
    const { yaml, cert } = copyExample();
    const before = readFileSync(yaml, 'utf8');
    const r = await run('check-certificate', yaml, cert, '-c', 'rope', ...C3, '--write', '--json');
    expect(r.code).toBe(exitCodes.ok);
    const j = JSON.parse(r.stdout);
    expect(j.written).toBe(true);
    const after = readFileSync(yaml, 'utf8');
    for (const line of before.split('\n'))
      if (!line.includes('ratedOutputVoltsPerVolt: 2 mV/V')) expect(after).toContain(line);
    expect(after).toMatch(
      /# from the certificate .*rope-certificate\.csv \(bridgework check-certificate, 2026-12-04\)\n {6}ratedOutputVoltsPerVolt: 0\.00200086/,
    );
    const loaded = await loadChannels(yaml, ['rope']);
    const sensor = loaded.channels[0]!.channel.spec.sensor as unknown as Record<string, number>;
    expect(sensor['ratedOutputVoltsPerVolt']).toBeNear(j.characteristics.sensitivity * 50, { rel: 1e-15 });
    expect(sensor['zeroBalanceVoltsPerVolt']).toBe(j.characteristics.zeroBalanceVoltsPerVolt);
    expect(sensor['certificateCelsius']).toBe(20);
    expect(sensor['zeroTemperatureCoefficientPerKelvin']).toBe(
      j.characteristics.zeroTemperatureCoefficientPerKelvin,
    );
    expect(sensor['spanTemperatureCoefficientPerKelvin']).toBe(
      j.characteristics.spanTemperatureCoefficientPerKelvin,
    );
    expect((await run('report', yaml, '-c', 'rope')).code).not.toBe(exitCodes.badInput);
  });

  it('a reading past the mpe fails with exit code 2 and writes nothing', async () => {
    const { yaml, cert } = copyExample();
    const lines = readFileSync(cert, 'utf8').split('\n');
    const i = lines.findIndex((l) => l.startsWith('load,40,2,up,20,'));
    const cells = lines[i]!.split(',');
    cells[5] = (Number(cells[5]) + 0.0008).toFixed(6); // +0.02 kN at 20 kN (mpe 0.0117 kN)
    lines[i] = cells.join(',');
    writeFileSync(cert, lines.join('\n'));
    const before = readFileSync(yaml, 'utf8');
    const r = await run('check-certificate', yaml, cert, '-c', 'rope', ...C3, '--write');
    expect(r.code).toBe(exitCodes.failedCheck);
    expect(r.stdout).toMatch(/check failed: load cell error, 40 °C/);
    expect(r.stdout).toMatch(/nothing written: a check failed/);
    expect(readFileSync(yaml, 'utf8')).toBe(before);
  });

  it('refuses what it cannot check, in the user’s terms', async () => {
    const { yaml, cert } = copyExample();
    const cases: [string[], RegExp][] = [
      [['--intervals', '3000'], /--class is required/],
      [
        ['--class', 'C', '--intervals', '3000', '--reference-celsius', '23'],
        /--reference-celsius 23: .* runs are at 20, 40, -10 °C/,
      ],
      [
        ['--class', 'C', '--intervals', '3000', '--max-load', '40 kN'],
        /load 50 lies outside the measuring range \[0, 40\]: give --min-load and --max-load/,
      ],
      [['--class', 'C', '--intervals', '3000', '--capacity', '40 bar'], /--capacity '40 bar'/],
      [['--class', 'C', '--intervals', '3000', '--load-unit', 'furlong'], /--load-unit/],
      [
        ['--class', 'C', '--intervals', '3000', '--reading', 'load', '--write'],
        /--write: readings given as load/,
      ],
      [['--class', 'C', '--intervals', '30000'], /class declaration/],
    ];
    for (const [args, message] of cases) {
      const r = await run('check-certificate', yaml, cert, '-c', 'rope', ...args);
      expect(r.stderr + r.stdout).toMatch(message);
      expect(r.code).toBe(args.includes('30000') ? exitCodes.failedCheck : exitCodes.badInput);
    }
    writeFileSync(cert, 'test,load,reading\nbend,0,0.1\n');
    const bad = await run(
      'check-certificate',
      yaml,
      cert,
      '-c',
      'rope',
      '--class',
      'C',
      '--intervals',
      '3000',
    );
    expect(bad.stderr).toMatch(
      /rope-certificate\.csv:2: column 'test' must be load, creep or return; got 'bend'/,
    );
    expect(bad.code).toBe(exitCodes.badInput);
  });
});
