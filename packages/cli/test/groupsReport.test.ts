/**
 * `bridgework report` on a file with groups (examples/test-rig-coupling/test-rig.yaml): the
 * coupling's matrix, cross-talk, conditions, per-component uncertainty and residuals, the stand's
 * factors and R 76 check, in text, JSON and HTML; the figures checked against independent
 * computations (mathjs, the scenario's forward model, Monte Carlo through the exact inverse).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { create, all } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { loadGroups, type MultiComponentGroup } from '../src/groups/loadGroups.js';
import { readingNoise } from '../src/groups/groupReport.js';
import { memoryIo } from './support/memoryIo.js';
import { useTempDir } from './support/tempDir.js';

const math = create(all as NonNullable<typeof all>, { number: 'BigNumber', precision: 40 });
const exampleDir = fileURLToPath(new URL('../../../examples/test-rig-coupling/', import.meta.url));
const example = join(exampleDir, 'test-rig.yaml');
const tmp = useTempDir('groups-report');

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

interface CouplingPayload {
  sensitivity: number[][];
  loadMatrix: number[][];
  crossTalk: number[][];
  components: { name: string; fullScale: number }[];
  standardUncertaintyAtZero: number[];
  readingStandardUncertainties: number[];
  largestLoadResidualFractions: number[];
  condition: number;
}

describe('report on a file with groups', () => {
  it('prints the coupling and the stand in text, with every table, and exits 0', async () => {
    const { code, stdout } = await run('report', example);
    expect(code).toBe(exitCodes.ok);
    expect(stdout).toContain('coupling: 6-component group');
    expect(stdout).toMatch(/sensitivity S \(mV\/V per component unit\)/);
    expect(stdout).toMatch(/cross-talk: each bridge's output at a component's full scale/);
    expect(stdout).toMatch(/load matrix C \(component unit per mV\/V\)/);
    expect(stdout).toMatch(/^ {2}Fx·My +/m);
    expect(stdout).toMatch(/^ {2}Mz \(N·m\) +200\.0 +[\d.]+ +[\d.]+ +[\d.]+ +[\d.]+ % FS +[\d.]+ % FS$/m);
    expect(stdout).toContain('stand: 4-cell platform');
    expect(stdout).toMatch(/^ {2}centre +checks +199\.99\d+ +−0\.007\d+ +0\.200 +3\.6 % +pass$/m);
    expect(stdout).toMatch(/^ {2}corner-1 +fits +200\.0000 +< 2e−10 +0\.200 +< .* +pass$/m);
    expect(stdout).toContain('pass  eccentricity (OIML R 76)');
    expect(stdout).toContain('Every check passed.');
    expect(stdout).toMatch(/do not replace, qualified engineering judgement/);
  });

  it('states in JSON what an independent computation gives: C = S⁻¹, cross-talk, the noise part of u', async () => {
    const { code, stdout } = await run('report', example, '--json');
    expect(code).toBe(exitCodes.ok);
    const json = JSON.parse(stdout) as { groups: { coupling: CouplingPayload } };
    const g = json.groups.coupling;
    // mathjs at 40 digits: the inverse of S (N = M, so C = S⁻¹ whatever the weights).
    const inv = math.inv(math.bignumber(g.sensitivity)) as unknown as { toNumber(): number }[][];
    g.loadMatrix.forEach((row, j) =>
      row.forEach((c, i) =>
        expect(c).toBeNear(Number(inv[j]![i]!.toString()), { rel: 1e-9, abs: 1e-9 * Math.abs(row[j]!) }),
      ),
    );
    // Cross-talk: S_ij·FS_j / (S_ip·FS_p), p the component of largest |S_ij|·FS_j.
    const fs = g.components.map((c) => c.fullScale);
    g.sensitivity.forEach((row, i) => {
      const scaled = row.map((s, j) => s * fs[j]!);
      const p = scaled.reduce((b, v, j) => (Math.abs(v) > Math.abs(scaled[b]!) ? j : b), 0);
      scaled.forEach((v, j) =>
        expect(g.crossTalk[i]![j]!).toBeNear(v / scaled[p]!, { rel: 1e-14, abs: 1e-16 }),
      );
    });
    // u at zero holds at least the reading noise carried through C (JCGM 100, linear at zero):
    // u_noise(F_j)² = Σ_i C_ji²·u_i², and the calibration's part on top of it.
    g.standardUncertaintyAtZero.forEach((u, j) => {
      const noise = Math.sqrt(
        g.loadMatrix[j]!.reduce((s, c, i) => s + (c * g.readingStandardUncertainties[i]!) ** 2, 0),
      );
      expect(u).toBeGreaterThanOrEqual(noise * (1 - 1e-12));
    });
  });

  it('the GUM figure at zero agrees with Monte Carlo through the exact inverse (JCGM 101)', async () => {
    const [g] = (await loadGroups(await loadChannels(example))) as [MultiComponentGroup];
    const noise = readingNoise(g);
    const { code, stdout } = await run('report', example, '--json');
    expect(code).toBe(exitCodes.ok);
    const gum = (JSON.parse(stdout) as { groups: { coupling: CouplingPayload } }).groups.coupling
      .standardUncertaintyAtZero;
    const mc = g.calibration.monteCarloAt({
      loads: [0, 0, 0, 0, 0, 0],
      readingStandardUncertainties: noise,
      trials: 20_000,
      seed: 7,
    });
    // Nearly linear at zero: the two agree within Monte Carlo's own spread (2·10⁴ trials: ~1 %).
    mc.forEach((r, j) => expect(r.standardUncertainty).toBeNear(gum[j]!, { rel: 0.03 }));
  });

  it("the report's Monte Carlo figures agree with an independent sampler written here, and with the GUM", async () => {
    const [g] = (await loadGroups(await loadChannels(example))) as [MultiComponentGroup];
    const c = g.fit!.calibration;
    const noise = readingNoise(g);
    const { code, stdout } = await run('report', example, '--json');
    expect(code).toBe(exitCodes.ok);
    const payload = (
      JSON.parse(stdout) as {
        groups: {
          coupling: CouplingPayload & {
            standardUncertaintyAtFullScale: number[];
            monteCarlo: {
              trials: number;
              atZero: { standardUncertainty: number; interval: [number, number] }[];
              atFullScale: { standardUncertainty: number }[];
            };
          };
        };
      }
    ).groups.coupling;
    expect(payload.monteCarlo.trials).toBe(10_000);
    // An independent sampler: readings = the model's readings at F, plus each bridge's noise
    // (independent, u_i from its channel budget) plus the calibration's error of the fitted
    // readings at F, normal with covariance q·Σ (q = g(F)ᵀ(AᵀA)⁻¹g(F), Σ the readings' covariance;
    // JCGM 100 for the multivariate linear model), drawn through a Cholesky factor written here;
    // each draw solved by the calibration's exact inverse.
    const nb = g.bridges.length;
    const sigma = c.readingCovariance;
    const chol = sigma.map(() => new Array<number>(nb).fill(0));
    for (let i = 0; i < nb; i++) {
      for (let k = 0; k <= i; k++) {
        let s = sigma[i]![k]!;
        for (let l = 0; l < k; l++) s -= chol[i]![l]! * chol[k]![l]!;
        chol[i]![k] = i === k ? Math.sqrt(Math.max(s, 0)) : chol[k]![k]! > 0 ? s / chol[k]![k]! : 0;
      }
    }
    let seed = 12345;
    const uniform = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) + 0.5) / 2147483648;
    const normal = () => Math.sqrt(-2 * Math.log(uniform())) * Math.cos(2 * Math.PI * uniform());
    const inverse = c.createInverse();
    const sampled = (loads: number[], j: number): number => {
      const gv = c.terms.map((t) => t.components.reduce((p, k) => p * loads[k]!, 1));
      const q = gv.reduce(
        (s, a, x) => s + gv.reduce((t, b, y) => t + a * c.unitCovariance[x]![y]! * b, 0),
        0,
      );
      const r0 = c.readingsAt(loads);
      const trials = 20_000;
      let sum = 0;
      let sum2 = 0;
      const r = new Array<number>(nb);
      for (let n = 0; n < trials; n++) {
        const z = Array.from({ length: nb }, normal);
        for (let i = 0; i < nb; i++) {
          let cal = 0;
          for (let k = 0; k <= i; k++) cal += chol[i]![k]! * z[k]!;
          r[i] = r0[i]! + Math.sqrt(q) * cal + noise[i]! * normal();
        }
        const f = inverse.loadsFromReadings(r)[j]!;
        sum += f;
        sum2 += f * f;
      }
      return Math.sqrt((sum2 - (sum * sum) / trials) / (trials - 1));
    };
    const zero = [0, 0, 0, 0, 0, 0];
    for (const j of [0, 2, 5]) {
      // Two Monte Carlo estimates of u, 10⁴ and 2·10⁴ trials: each within ~1 %, so 4 % apart at most.
      expect(payload.monteCarlo.atZero[j]!.standardUncertainty).toBeNear(sampled(zero, j), { rel: 0.04 });
      const full = zero.map((_, k) => (k === j ? payload.components[j]!.fullScale : 0));
      expect(payload.monteCarlo.atFullScale[j]!.standardUncertainty).toBeNear(sampled(full, j), {
        rel: 0.04,
      });
    }
    // And both methods (JCGM 101 against JCGM 100) agree where the model is nearly linear.
    payload.monteCarlo.atZero.forEach((r, j) =>
      expect(r.standardUncertainty).toBeNear(payload.standardUncertaintyAtZero[j]!, { rel: 0.03 }),
    );
    payload.monteCarlo.atFullScale.forEach((r, j) =>
      expect(r.standardUncertainty).toBeNear(payload.standardUncertaintyAtFullScale[j]!, { rel: 0.03 }),
    );
    const [lo, hi] = payload.monteCarlo.atZero[0]!.interval;
    expect(lo).toBeLessThan(0);
    expect(hi).toBeGreaterThan(0);
  });

  it('writes the HTML report with the group sections and a residual plot per component', async () => {
    const html = join(tmp(), 'rig.html');
    const { code } = await run('report', example, '--html', html);
    expect(code).toBe(exitCodes.ok);
    const page = readFileSync(html, 'utf8');
    expect(page).toContain('coupling: 6-component group');
    expect(page).toContain('data-plot="group-coupling-residuals"');
    expect(page).toMatch(
      /data-plot="group-coupling-residuals"[^>]*data-series-count="6"|data-series-count="6"[^>]*data-plot="group-coupling-residuals"/,
    );
    for (const c of ['Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz']) expect(page).toContain(`data-series="${c}"`);
    expect(page).toContain('stand: 4-cell platform');
    expect(page).toContain('eccentricity (OIML R 76)');
  });

  it('exits 2 and says FAIL when the eccentricity test exceeds the mpe', async () => {
    const dir = tmp();
    for (const f of ['coupling-schedule.csv', 'stand-eccentricity.csv'])
      writeFileSync(join(dir, f), readFileSync(join(exampleDir, f)));
    // Class II with e = 2 g: 200 kg is 100 000 e, mpe 1.5 e = 3 g (OIML R 76-1 Table 6, from
    // memory), and the centre reads 7.2 g low.
    const path = join(dir, 'fine.yaml');
    writeFileSync(
      path,
      readFileSync(example, 'utf8')
        .replace('accuracyClass: III', 'accuracyClass: II')
        .replace('verificationInterval: 0.2 kg', 'verificationInterval: 2 g'),
    );
    const { code, stdout } = await run('report', path);
    expect(code).toBe(exitCodes.failedCheck);
    expect(stdout).toMatch(/^ {2}centre +checks +199\.99\d+ +−0\.007\d+ +0\.00300 +2\d\d\.\d % +FAIL$/m);
    expect(stdout).toMatch(/FAIL {2}eccentricity \(OIML R 76\)/);
    expect(stdout).not.toContain('Every check passed.');
  });
});
