/**
 * The worked example of docs/calibration.md is examples/hopper-load-cell-calibration.ts; the
 * repository's examples test runs it for the caution line. Here its key printed figures are
 * checked against hand calculations from the logged data, so the guide's numbers cannot drift.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

describe('examples/hopper-load-cell-calibration.ts', () => {
  // Run in this process (the repository's examples test runs it as a program): capture what it
  // prints, then restore console.log.
  let out = '';
  let log: ReturnType<typeof vi.spyOn> | undefined;
  beforeAll(async () => {
    log = vi.spyOn(console, 'log').mockImplementation((...args: unknown[]) => {
      out += `${args.join(' ')}\n`;
    });
    try {
      await import('../../../examples/hopper-load-cell-calibration.js');
    } finally {
      log.mockRestore();
    }
  });
  afterAll(() => log?.mockRestore());
  const number = (pattern: RegExp): number => Number(pattern.exec(out)?.[1]);

  it('prints the rated output and terminal nonlinearity of the logged runs (by hand)', () => {
    // RO = mean of (2.016000 − 0.015200, 2.016020 − 0.015210) = 2.000805 mV/V. Mean ascending at
    // 1000 kg is 1.015825, the terminal line there (0.015205 + 2.016010)/2 = 1.0156075: deviation
    // 0.0002175 mV/V = 0.01087 % RO, the largest (500 kg: 0.00016375; 1500 kg: 0.00013625).
    expect(number(/rated output\s+([\d.]+) mV\/V/)).toBeNear(2.000805, { abs: 5e-7 });
    expect(number(/terminal nonlinearity\s+([\d.]+) %/)).toBeNear((100 * 0.0002175) / 2.000805, {
      abs: 5e-5,
    });
  });

  it('prints the shunt step −R/(2(R + 2Rs)) reversed for arm 2, and its equivalent load', () => {
    // Arm 2, 350 Ω, 59 kΩ: +350/(2·(350 + 118 000)) = 1.478664 mV/V; 2000·1.47832/2.000805 kg.
    expect(number(/computed shunt step\s+([\d.]+) mV\/V/)).toBeNear(350e3 / (2 * 118_350), { abs: 5e-6 });
    expect(number(/equivalent load\s+([\d.]+) kg/)).toBeNear((2000 * 1.47832) / 2.000805, { abs: 0.05 });
  });

  it('prints the C3 verification interval, vmin and creep limit (by hand)', () => {
    // v = 2000/3000 kg; vmin = 2000/15 000 kg; creep over 30 min at Dmax: 0.7 × 0.7 × 1.5 × v = 0.49 kg.
    expect(number(/v = ([\d.]+) kg/)).toBeNear(2000 / 3000, { abs: 5e-5 });
    expect(number(/vmin = Emax\/Y = ([\d.]+) kg/)).toBeNear(2000 / 15_000, { abs: 5e-5 });
    expect(number(/in 30 min \(limit ([\d.]+)\)/)).toBeNear(0.49, { abs: 5e-4 });
    expect(out).toMatch(/errors within mpe\s+yes/);
  });
});
