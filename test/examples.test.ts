/**
 * Every program in examples/ runs here, so examples cannot rot. Key printed numbers are checked
 * against an independent calculation.
 */
import { execFileSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('..', import.meta.url));
const examples = readdirSync(new URL('../examples', import.meta.url)).filter((f) => f.endsWith('.ts'));

function run(file: string): string {
  return execFileSync(
    process.execPath,
    ['--import', 'tsx', '--conditions=@bridgework/source', `examples/${file}`],
    {
      cwd: root,
      encoding: 'utf8',
      env: { ...process.env, NO_COLOR: '1' },
    },
  );
}

describe('examples', () => {
  it.each(examples)('%s runs and prints the safety caution', (file) => {
    const out = run(file);
    expect(out).toMatch(/do not replace,\s+qualified engineering judgement/);
  });

  it('footbridge-hanger: the exact two-reading strain matches the full-poisson equation solved by hand', () => {
    const out = run('footbridge-hanger.ts');
    // Full-poisson bridge: r = x(1+ν)/(2 + x(1−ν)), x = GF·ε (see docs/bridge.md) ⇒
    // x = 2r/((1+ν) − r(1−ν)); strain from zero = (x1 − x0)/(GF(1 + x0)).
    const gf = 2.09;
    const nu = 0.3;
    const x = (r: number) => (2 * r) / (1 + nu - r * (1 - nu));
    const x0 = x(0.0412e-3);
    const x1 = x(0.9718e-3);
    const strain = (x1 - x0) / (gf * (1 + x0));
    const printed = Number(/exact two-reading strain\s+([-\d.]+) µε/.exec(out)?.[1]);
    expect(printed).toBeNear(strain * 1e6, { abs: 0.005 }); // printed to 2 decimals
    const force = Number(/hanger force\s+([-\d.]+) kN/.exec(out)?.[1]);
    expect(force).toBeNear((205e9 * 561e-6 * strain) / 1e3, { abs: 0.005 });
  });

  it('rosette-transverse: the printed corrected legs reproduce the readings through the transverse model', () => {
    const out = run('rosette-transverse.ts');
    const legs = ['a', 'b', 'c'].map((leg) => {
      const m = new RegExp(`^${leg}\\s+([-\\d.]+)\\s+([-\\d.]+)$`, 'm').exec(out);
      return [Number(m?.[1]), Number(m?.[2])] as const;
    });
    // Strain along θ from the corrected legs of a 0/45/90 rosette: εx = εa, εy = εc, γ = 2εb − εa − εc,
    // ε(θ) = (εx + εy)/2 + (εx − εy)/2·cos 2θ + γ/2·sin 2θ (Mohr; any mechanics text).
    const [a, b, c] = legs.map((l) => l[1]) as [number, number, number];
    const gamma = 2 * b - a - c;
    const along = (t: number) =>
      (a + c) / 2 + ((a - c) / 2) * Math.cos(2 * t) + (gamma / 2) * Math.sin(2 * t);
    const kt = [0.018, 0.011, 0.018];
    const angles = [0, Math.PI / 4, Math.PI / 2];
    // Indicated strain of a gauge: (ε_axial + Kt·ε_transverse)/(1 − ν0·Kt), ν0 = 0.285 (common practice).
    legs.forEach(([indicated], i) => {
      const t = angles[i]!;
      const predicted = (along(t) + kt[i]! * along(t + Math.PI / 2)) / (1 - 0.285 * kt[i]!);
      expect(predicted).toBeNear(indicated, { abs: 0.02 }); // printed to 2 decimals (µε)
    });
  });

  it('test-rig-coupling-calibration: digital corner factors are 1/sensitivity; GUM and Monte Carlo agree', () => {
    const out = run('test-rig-coupling-calibration.ts');
    // Each cell's reading per kg is s_i, so the factor that makes Σ k_i·r_i the load is 1/s_i
    // (kg per V/V; printed per mV/V): 300/2.006 … (the example's cells are 2.006 mV/V per 300 kg).
    const factors = /digital factors \(kg per mV\/V\): ([\d., ]+)/.exec(out)![1]!.split(', ').map(Number);
    [2.006, 1.994, 2.011, 1.989].forEach((s, i) => expect(factors[i]!).toBeNear(300 / s, { abs: 0.0005 }));
    const rows = [...out.matchAll(/^ {5}(Fx|Fy|Fz|Mx|My|Mz) +([\d.]+) \| +([\d.]+)$/gm)];
    expect(rows).toHaveLength(6);
    // JCGM 101 against JCGM 100 on a nearly linear model: within 2 % with 2·10⁴ trials.
    for (const r of rows) expect(Number(r[3])).toBeNear(Number(r[2]), { rel: 0.02 });
  });
});
