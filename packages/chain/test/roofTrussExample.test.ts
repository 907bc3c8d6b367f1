/**
 * The worked example of docs/chain.md (examples/roof-truss-tie.ts) runs, and its key printed
 * numbers agree with a calculation by hand from the textbook equations.
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { BOLTZMANN_JOULES_PER_KELVIN } from '@bridgework/core';

const root = fileURLToPath(new URL('../../..', import.meta.url));
const out = execFileSync(
  process.execPath,
  ['--import', 'tsx', '--conditions=@bridgework/source', 'examples/roof-truss-tie.ts'],
  { cwd: root, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } },
);
const number = (pattern: RegExp): number => Number(pattern.exec(out)?.[1]);

// Hand model: full-Poisson bridge, 350 Ω arms, GF 2.11, ν 0.3, 0.55 Ω in each excitation lead.
const gf = 2.11;
const nu = 0.3;
const rs = 2 * 0.55;
const slope = ((gf * (1 + nu)) / 2) * (350 / (350 + rs)); // GF(1 + ν)/2 × the four-wire span loss Rin/(Rin + 2RL)
const e = 5;
// Output resistance of four equal arms R with Rs in series with the source:
// (T + Rs·W)/(PQ + Rs·S) with P = Q = 2R, T = R1R2·Q + R3R4·P = 4R³, W = 4R², S = 4R (docs/bridge.md).
const R = 350;
const rth = (4 * R ** 3 + rs * 4 * R ** 2) / (4 * R ** 2 + rs * 4 * R);
const kT = BOLTZMANN_JOULES_PER_KELVIN * 298.15;

describe('examples/roof-truss-tie.ts', () => {
  it('prints the safety caution', () => {
    expect(out).toMatch(/do not replace,\s+qualified engineering judgement/);
  });

  it('slope and counts per µε: GF(1 + ν)/2 less the lead loss, times 2^30 counts per V/V', () => {
    expect(number(/slope ([\d.]+) V\/V per m\/m/)).toBeNear(slope, { abs: 5e-7 }); // printed to 6 decimals
    expect(number(/counts per µε\s+([\d.]+)/)).toBeNear((2 ** 30 * slope) / 1e6, { abs: 5e-4 });
  });

  it('input noise density: √(e_n² + 4kT(R_out + 998 Ω) + i_n²(a² + b²)) with a = b = R/2 + 499 Ω', () => {
    // With Rs ≠ 0 each transimpedance is slightly off R/2; the current term is 0.02 % of the total
    // power here, so the stiff-source values are good to far better than the printed 3 decimals.
    const density = Math.sqrt(15e-9 ** 2 + 4 * kT * (rth + 998) + 0.2e-12 ** 2 * 2 * (R / 2 + 499) ** 2);
    expect(number(/Input noise density ([\d.]+) nV/)).toBeNear(density * 1e9, { abs: 5e-4 });
  });

  it('chopper case: σ² = density²·ENBW + q²/12, resolution σ/(E·slope)', () => {
    const density2 = 15e-9 ** 2 + 4 * kT * (rth + 998) + 0.2e-12 ** 2 * 2 * (R / 2 + 499) ** 2;
    const q = e / (128 * 2 ** 23);
    const sigma = Math.sqrt(density2 * 0.275 * 10 + q ** 2 / 12);
    const microstrain = sigma / (e * slope * 1e-6);
    expect(number(/chopper-stabilised PGA: gain 128, ([\d.]+) µε rms/)).toBeNear(microstrain, { abs: 5e-5 });
  });

  it('gauge power: the hottest arm over the span, from the two equal dividers by hand', () => {
    // At strain ε: R1 = R3 = R(1 + GFε), R2 = R4 = R(1 − νGFε); the bridge presents (R1 + R2)/2,
    // so Vb = E·Rin/(Rin + Rs), each divider carries Vb/(R1 + R2) and arm i dissipates I²Ri.
    const hottest = Math.max(
      ...[-300e-6, 0, 1200e-6].flatMap((eps) => {
        const r1 = R * (1 + gf * eps);
        const r2 = R * (1 - nu * gf * eps);
        const rin = (r1 + r2) / 2;
        const i = (e * rin) / (rin + rs) / (r1 + r2);
        return [i * i * r1, i * i * r2];
      }),
    );
    expect(number(/gauge power\s+([\d.]+) mW/)).toBeNear(hottest * 1e3, { abs: 5e-3 });
  });
});
