/**
 * `bridgework constants` on a file with groups (examples/test-rig-coupling/test-rig.yaml): the
 * coupling's load matrix and interaction coefficients and the stand's factors as C, compiled by
 * gcc with the strict flags; the compiled linear maps stay within their proved bounds of a
 * 40-digit decimal.js evaluation of the calibration's linear map over sampled readings, and the
 * interaction coefficients, iterated in C, reproduce the library's inverse.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Decimal } from 'decimal.js';
import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { loadGroups, type MultiComponentGroup, type PlatformGroup } from '../src/groups/loadGroups.js';
import {
  compile,
  CORTEX_M4F_FLAGS,
  needCompiler,
  run as runProgram,
  scratch,
  STRICT_FLAGS,
  writeFiles,
} from '../../firmware/test/support/cc.js';
import { memoryIo } from './support/memoryIo.js';
import { useTempDir } from './support/tempDir.js';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_EVEN });
const example = fileURLToPath(new URL('../../../examples/test-rig-coupling/test-rig.yaml', import.meta.url));
const tmp = useTempDir('groups-constants');

async function cli(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

interface PlainMap {
  precision: 'float32' | 'float64';
  bounds: number[];
}
interface JsonGroup {
  name: string;
  linear: PlainMap[];
}

const driver = `#include <stdio.h>
#include "rig.h"
int main(void) {
    double x[10];
    float xf[10];
    float cf[6];
    double cd[6];
    float wf[1];
    double wd[1];
    double f[6];
    double g[21];
    double dg[6];
    int i;
    int k;
    while (scanf("%lf %lf %lf %lf %lf %lf %lf %lf %lf %lf", &x[0], &x[1], &x[2], &x[3], &x[4], &x[5], &x[6], &x[7], &x[8], &x[9]) == 10) {
        for (i = 0; i < 10; i++) xf[i] = (float)x[i];
        rig_coupling_f32(xf, cf);
        rig_coupling_f64(x, cd);
        rig_stand_f32(xf + 6, wf);
        rig_stand_f64(x + 6, wd);
        /* The interaction model's fixed-point iteration F <- y - D g(F), 60 steps from F = y. */
        for (i = 0; i < 6; i++) f[i] = cd[i];
        for (k = 0; k < 60; k++) {
            for (i = 0; i < 21; i++) g[i] = f[rig_coupling_term_a[i]] * f[rig_coupling_term_b[i]];
            rig_coupling_interaction_f64(g, dg);
            for (i = 0; i < 6; i++) f[i] = cd[i] - dg[i];
        }
        for (i = 0; i < 6; i++) printf("%.17g %.17g %.17g ", (double)cf[i], cd[i], f[i]);
        printf("%.17g %.17g\\n", (double)wf[0], wd[0]);
    }
    return 0;
}
`;

describe('constants on a file with groups', async () => {
  const loaded = await loadChannels(example);
  const [coupling, stand] = (await loadGroups(loaded)) as [MultiComponentGroup, PlatformGroup];

  it(
    'appends the groups after the channels, with their bounds and the caution',
    { timeout: 240_000 },
    async () => {
      const r = await cli('constants', example, '--verification', 'sampled');
      expect(r.code).toBe(exitCodes.ok);
      expect(r.stdout).toMatch(/#endif[^\n]*\n\/\* Multi-bridge groups of .*test-rig\.yaml by bridgework/);
      expect(r.stdout).toContain('#ifndef BRIDGEWORK_GROUPS_H');
      expect(r.stdout).toMatch(
        /float32: proved total error against the calibration's linear map, inputs within the spans: Fx [\d.e-]+ N/,
      );
      expect(r.stdout).toContain('no bound is stated for the\n * iteration in C');
      expect(r.stdout).toContain('Results support, and do not replace, qualified engineering judgement');
      // With one channel selected there is no group to write.
      expect(
        (await cli('constants', example, '--channel', 'b1', '--verification', 'sampled')).stdout,
      ).not.toContain('Multi-bridge groups');
    },
  );

  it(
    'compiles (gcc, strict flags); the C is within its proved bound of the 40-digit map, and iterates to the library’s inverse',
    { timeout: 240_000 },
    async (ctx) => {
      if (!needCompiler('gcc', () => ctx.skip())) return;
      const header = join(tmp(), 'rig.h');
      expect(
        (await cli('constants', example, '--prefix', 'rig', '--verification', 'sampled', '-o', header)).code,
      ).toBe(exitCodes.ok);
      const json = JSON.parse(
        (await cli('constants', example, '--prefix', 'rig', '--verification', 'sampled', '--format', 'json'))
          .stdout,
      ) as {
        groups: JsonGroup[];
      };
      const bounds = (name: string, precision: string) =>
        json.groups.find((g) => g.name === name)!.linear.find((m) => m.precision === precision)!.bounds;
      const { dir, remove } = scratch();
      try {
        writeFiles(dir, { 'rig.h': readFileSync(header, 'utf8'), 'driver.c': driver });
        compile('gcc', [...STRICT_FLAGS, '-O2', '-o', 'driver', 'driver.c'], dir);
        // Readings over the bridges' spans: the corners of ±1.5 mV/V and pseudo-random points.
        let seed = 99;
        const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) * 2 - 1;
        const xs: number[][] = [];
        for (let k = 0; k < 400; k++) {
          const corner = k < 64;
          xs.push([
            ...Array.from({ length: 6 }, (_, i) => (corner ? ((k >> i) & 1 ? 1.5 : -1.5) : 0.4 * rand())),
            ...Array.from({ length: 4 }, () => 1.25 + 1.75 * rand()),
          ]);
        }
        const out = runProgram(
          './driver',
          xs.map((x) => x.map((v) => v.toPrecision(17)).join(' ')).join('\n'),
          dir,
        )
          .trimEnd()
          .split('\n')
          .map((l) => l.trim().split(' ').map(Number));
        const c = coupling.calibration;
        const inverse = c.createInverse();
        const b32 = bounds('coupling', 'float32');
        const b64 = bounds('coupling', 'float64');
        const w32 = bounds('stand', 'float32')[0]!;
        const w64 = bounds('stand', 'float64')[0]!;
        out.forEach((v, s) => {
          const x = xs[s]!;
          for (let j = 0; j < 6; j++) {
            // The calibration's linear map at 40 digits: Σ C_ji·(x_i − a_i).
            const ref = c.loadMatrix[j]!.reduce(
              (acc, cji, i) => acc.plus(new D(cji).times(new D(x[i]!).minus(c.offsets[i]!))),
              new D(0),
            );
            expect(Math.abs(new D(v[3 * j]!).minus(ref).toNumber())).toBeLessThanOrEqual(b32[j]!);
            expect(Math.abs(new D(v[3 * j + 1]!).minus(ref).toNumber())).toBeLessThanOrEqual(b64[j]!);
          }
          const wRef = stand.factors.factors.reduce(
            (acc, k, i) => acc.plus(new D(k).times(x[6 + i]!)),
            new D(0),
          );
          expect(Math.abs(new D(v[18]!).minus(wRef).toNumber())).toBeLessThanOrEqual(w32);
          expect(Math.abs(new D(v[19]!).minus(wRef).toNumber())).toBeLessThanOrEqual(w64);
          if (s >= 64) {
            // Inside full scale, the C iteration with the emitted D and term indices lands on the
            // library's inverse (fixed point of the same equation; both converged far below 1e-9).
            const lib = inverse.loadsFromReadings(x.slice(0, 6));
            for (let j = 0; j < 6; j++)
              expect(v[3 * j + 2]!).toBeNear(lib[j]!, { abs: 1e-9 * c.fullScale[j]! });
          }
        });
      } finally {
        remove();
      }
    },
  );
  it(
    'cross-compiles for a Cortex-M0+ and a Cortex-M4F (arm-none-eabi-gcc, strict flags, -O2), every group function used',
    { timeout: 240_000 },
    async (ctx) => {
      if (!needCompiler('arm-none-eabi-gcc', () => ctx.skip())) return;
      const header = join(tmp(), 'rig-arm.h');
      expect(
        (await cli('constants', example, '--prefix', 'rig', '--verification', 'sampled', '-o', header)).code,
      ).toBe(exitCodes.ok);
      // A translation unit that calls every group function and reads the term tables, so nothing
      // of the groups' section is left uncompiled.
      const unit = `#include "rig.h"
void use(const float xf[10], const double x[10], float yf[7], double y[7], float gf[21], double g[21],
         float df[6], double dd[6]);
void use(const float xf[10], const double x[10], float yf[7], double y[7], float gf[21], double g[21],
         float df[6], double dd[6]) {
    int i;
    rig_coupling_f32(xf, yf);
    rig_coupling_f64(x, y);
    rig_stand_f32(xf + 6, yf + 6);
    rig_stand_f64(x + 6, y + 6);
    for (i = 0; i < 21; i++) {
        gf[i] = yf[rig_coupling_term_a[i]] * yf[rig_coupling_term_b[i]];
        g[i] = y[rig_coupling_term_a[i]] * y[rig_coupling_term_b[i]];
    }
    rig_coupling_interaction_f32(gf, df);
    rig_coupling_interaction_f64(g, dd);
}
`;
      const { dir, remove } = scratch();
      try {
        writeFiles(dir, { 'rig.h': readFileSync(header, 'utf8'), 'unit.c': unit });
        for (const flags of [['-mcpu=cortex-m0plus', '-mthumb'], CORTEX_M4F_FLAGS]) {
          compile(
            'arm-none-eabi-gcc',
            [...flags, ...STRICT_FLAGS, '-O2', '-c', 'unit.c', '-o', 'unit.o'],
            dir,
          );
          const symbols = execFileSync('arm-none-eabi-nm', ['-u', 'unit.o'], { cwd: dir, encoding: 'utf8' })
            .split('\n')
            .map((l) => l.trim().split(/\s+/).pop() ?? '')
            .filter((s) => s !== '');
          if (flags === CORTEX_M4F_FLAGS) {
            // float32 runs on the FPU: software float appears only for the float64 functions.
            expect(symbols.filter((s) => /^__aeabi_f(add|mul|sub)$/.test(s))).toEqual([]);
          } else {
            // The M0+ has no FPU: the float arithmetic is the compiler's library (__aeabi_*), nothing else.
            expect(symbols.every((s) => s.startsWith('__aeabi_'))).toBe(true);
            expect(symbols).toContain('__aeabi_fmul');
          }
        }
      } finally {
        remove();
      }
    },
  );
});
