/**
 * examples/gantry-crane.ts runs (the root suite runs every example); here its printed numbers are
 * checked against the handbook equations worked independently of the package.
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../..', import.meta.url));
let out = '';
const number = (pattern: RegExp): number => Number(pattern.exec(out)?.[1]);

describe('examples/gantry-crane.ts', () => {
  beforeAll(() => {
    out = execFileSync(
      process.execPath,
      ['--import', 'tsx', '--conditions=@bridgework/source', 'examples/gantry-crane.ts'],
      { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } },
    );
  });

  it('prints the rosette stresses of the rectangular-rosette and plane-stress equations', () => {
    // Rectangular rosette 412 / −118 / −236 µε: εx = 412, εy = −236, γxy = 2(−118) − 412 + 236 =
    // −412 µε; Mohr: c = 88, R = √(324² + 206²); Hooke for plane stress with E = 205 GPa, ν = 0.3.
    const c = 88e-6;
    const r = Math.hypot(324e-6, 206e-6);
    const k = 205e9 / (1 - 0.09);
    const s1 = k * (c + r + 0.3 * (c - r));
    const s2 = k * (c - r + 0.3 * (c + r));
    expect(number(/ε1\s+([-\d.]+)/)).toBeNear((c + r) * 1e6, { abs: 0.05 }); // printed to 0.1 µε
    expect(number(/σ1\s+([-\d.]+)/)).toBeNear(s1 / 1e6, { abs: 0.05 }); // printed to 0.1 MPa
    expect(number(/σ2\s+([-\d.]+)/)).toBeNear(s2 / 1e6, { abs: 0.05 });
    expect(number(/von Mises\s+([-\d.]+)/)).toBeNear(Math.sqrt(s1 * s1 - s1 * s2 + s2 * s2) / 1e6, {
      abs: 0.05,
    });
    // 2θp = atan2(γ, εx − εy) = atan2(−412, 648).
    expect(number(/direction of ε1 ([-\d.]+)°/)).toBeNear((0.5 * Math.atan2(-412, 648) * 180) / Math.PI, {
      abs: 0.05,
    });
  });

  it('prints the torque of the full-shear bridge and Coulomb torsion equations', () => {
    // Full-shear bridge, six-wire: ratio = GF·ε exactly (docs/bridge.md), so ε = r/GF; from zero,
    // ε = (ε1 − ε0)/(1 + GF·ε0). Hollow shaft: T = E·ε/(1 + ν)·π(D⁴ − d⁴)/(16D).
    const gf = 2.05;
    const e0 = 0.0093e-3 / gf;
    const e1 = 0.8537e-3 / gf;
    const strain = (e1 - e0) / (1 + gf * e0);
    const torque = ((205e9 * strain) / 1.3) * ((Math.PI * (0.07 ** 4 - 0.045 ** 4)) / (16 * 0.07));
    expect(number(/\+45° gauge strain\s+([-\d.]+) µε/)).toBeNear(strain * 1e6, { abs: 0.005 });
    expect(number(/shaft torque\s+([-\d.]+) N·m/)).toBeNear(torque, { abs: 0.5 }); // printed to 1 N·m
    expect(out).toMatch(/do not replace,\s+qualified engineering judgement/);
  });
});
