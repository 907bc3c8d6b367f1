/**
 * The channel file's `groups` section: a six-component coupling and a four-cell stand
 * (examples/test-rig-coupling), loaded, fitted and checked against the forward models that
 * generated their data (examples/test-rig-coupling/scenario.ts), and every problem of a group
 * reported in the user's terms with its place in the file.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { BridgeworkError } from '@bridgework/core';
import { loadChannels } from '../src/channels/loadChannels.js';
import { loadGroups, type MultiComponentGroup, type PlatformGroup } from '../src/groups/loadGroups.js';
import {
  cellOutputs,
  fullScale,
  trueSensitivity,
  testLoad,
} from '../../../examples/test-rig-coupling/scenario.js';
import { caught } from './support/caught.js';
import { useTempDir } from './support/tempDir.js';

const exampleDir = fileURLToPath(new URL('../../../examples/test-rig-coupling/', import.meta.url));
const example = join(exampleDir, 'test-rig.yaml');
const tmp = useTempDir('groups');

async function groupsOf(path: string) {
  return loadGroups(await loadChannels(path));
}

/** Writes the example's channel file, edited, beside copies of its data files; returns its path. */
function variant(name: string, edit: (yaml: string) => string, files: Record<string, string> = {}): string {
  const dir = tmp();
  for (const f of ['coupling-schedule.csv', 'stand-eccentricity.csv'])
    writeFileSync(join(dir, f), readFileSync(join(exampleDir, f)));
  for (const [f, text] of Object.entries(files)) writeFileSync(join(dir, f), text);
  const path = join(dir, name);
  writeFileSync(path, edit(readFileSync(example, 'utf8')));
  return path;
}

async function problems(path: string): Promise<string> {
  const run = await caught(groupsOf(path));
  expect(run).toThrowBridgeworkError('invalid-spec');
  try {
    run();
  } catch (e) {
    return (e as BridgeworkError).message;
  }
  return '';
}

describe('the example test rig (examples/test-rig-coupling/test-rig.yaml)', () => {
  it('fits the coupling: the recovered sensitivity is the generator’s within 4 standard uncertainties', async () => {
    const [coupling] = (await groupsOf(example)) as [MultiComponentGroup];
    const c = coupling.fit!.calibration;
    expect(c.components).toEqual(['Fx', 'Fy', 'Fz', 'Mx', 'My', 'Mz']);
    expect(c.rejectedTerms).toEqual([]);
    expect(c.terms).toHaveLength(1 + 6 + 21); // offset, linear, squares and products (AIAA R-091's full second order)
    // The independent forward model of scenario.ts generated the schedule with 1e-4 mV/V rms noise.
    c.sensitivity.forEach((row, i) =>
      row.forEach((s, j) => {
        const t = c.terms.findIndex((x) => x.kind === 'linear' && x.components[0] === j);
        const u = c.coefficientStandardUncertainties[i]![t]!;
        expect(s).toBeNear(trueSensitivity[i]![j]!, { abs: 4 * u });
        expect(u * fullScale[j]!).toBeLessThan(2e-4); // a few 1e-5 mV/V at full scale: the fit is informative
      }),
    );
    expect(c.fullScale).toEqual([...fullScale]);
    // Each load's residual stays within a few noise widths: 1e-4 mV/V against ~1 mV/V per full scale.
    c.largestLoadResidualFractions.forEach((f) => expect(f).toBeLessThan(5e-4));
  });

  it('fits the stand: every corner reads the test load, the centre check within the R 76 mpe', async () => {
    const [, stand] = (await groupsOf(example)) as [MultiComponentGroup, PlatformGroup];
    expect(stand.positions).toEqual(['corner-1', 'corner-2', 'corner-3', 'corner-4', 'centre']);
    expect(stand.fitted).toEqual([true, true, true, true, false]);
    stand.indications.slice(0, 4).forEach((w) => expect(w).toBeNear(testLoad, { rel: 1e-12 }));
    // Each cell gives cellOutputs[i] mV/V per 300 kg, so its factor is 300/cellOutputs[i] kg per
    // mV/V up to the test's 2e-5 mV/V noise (scenario.ts).
    stand.factors.factors.forEach((k, i) => expect(k).toBeNear(300 / cellOutputs[i]!, { rel: 2e-4 }));
    // OIML R 76-1 3.5.1 Table 6 (from memory): class III, 200 kg = 1000 e lies in 500 e … 2000 e,
    // so the mpe on initial verification is 1.0 e = 0.2 kg.
    expect(stand.eccentricity.value.mpe).toBeNear(0.2, { rel: 1e-15 });
    expect(stand.eccentricity.ok).toBe(true);
    const centre = stand.indications[4]!;
    expect(Math.abs(centre - testLoad)).toBeLessThan(0.2);
    expect(stand.eccentricity.value.rows[4]!.error).toBeNear(centre - testLoad, { abs: 1e-12 });
  });
});

describe('problems of a group, in the user’s terms', () => {
  it('names each bad field with its line, the unit, the limit and a way out, all at once', async () => {
    const path = variant('bad.yaml', (y) =>
      y
        .replace('bridges: [b1, b2, b3, b4, b5, b6]', 'bridges: [b1, b2, b3, b4, b5, b7]')
        .replace('Mz: { unit: N·m, fullScale: 200 N·m }', 'Mz: { unit: furlong, fullScale: 200 N·m }')
        .replace('interactions: second-order', 'interactions: cubic')
        .replace('testLoad: 200 kg', 'testLoad: 700 kg')
        .replace('accuracyClass: III', 'accuracyClass: V'),
    );
    const text = await problems(path);
    expect(text).toContain('has 5 problems');
    expect(text).toMatch(
      /bad\.yaml:\d+:\d+: groups\.coupling\.bridges\[5\]: 'b7' is not a channel of this file; did you mean/,
    );
    expect(text).toMatch(/groups\.coupling\.components\.Mz\.unit: 'furlong' is not a unit of force, torque/);
    expect(text).toContain(
      'groups.coupling.calibration.interactions: must be one of none, squares, products, second-order',
    );
    expect(text).toMatch(
      /groups\.stand\.eccentricity\.testLoad: '700 kg' is above Max \('600 kg'\); use a test load of about Max\/3/,
    );
    expect(text).toMatch(/groups\.stand\.eccentricity\.accuracyClass: must be one of I, II, III, IIII/);
  });

  it('refuses a schedule that never loads a component, naming it', async () => {
    const schedule = readFileSync(join(exampleDir, 'coupling-schedule.csv'), 'utf8')
      .split('\n')
      .map((l) =>
        l.startsWith('#') || l.startsWith('Fx') || l === '' ? l : l.replace(/^(([^,]*,){5})[^,]*/, '$10'),
      )
      .join('\n');
    const path = variant(
      'unloaded.yaml',
      (y) => y.replace('schedule: coupling-schedule.csv', 'schedule: ' + 'no-mz.csv'),
      {
        'no-mz.csv': schedule,
      },
    );
    const text = await problems(path);
    expect(text).toMatch(
      /groups\.coupling\.calibration\.schedule: no-mz\.csv does not determine the calibration: .*component Mz is never loaded/,
    );
    expect(text).toContain('load every component on its own at several levels');
  });

  it('places a bad number of a schedule at its line and column, and a missing column', async () => {
    const lines = readFileSync(join(exampleDir, 'coupling-schedule.csv'), 'utf8').split('\n');
    lines[5] = lines[5]!.replace(/,[^,]*,ascending$/, ',1.2.3,ascending');
    const path = variant(
      'cell.yaml',
      (y) => y.replace('schedule: coupling-schedule.csv', 'schedule: ' + 'bad-cell.csv'),
      {
        'bad-cell.csv': lines.join('\n'),
      },
    );
    expect(await problems(path)).toContain("bad-cell.csv:6 (b6): '1.2.3' is not a finite number");
    const noColumn = lines.map((l) => l.replace(/,b6 \[mV\/V\]/, ',b9 [mV/V]')).join('\n');
    const path2 = variant(
      'column.yaml',
      (y) => y.replace('schedule: coupling-schedule.csv', 'schedule: ' + 'no-col.csv'),
      {
        'no-col.csv': noColumn,
      },
    );
    const text = await problems(path2);
    expect(text).toContain("'b9' is not a column of this table");
    expect(text).toContain("has no column 'b6'");
  });

  it('converts units written in a schedule heading (kN, V/V) to the component’s and the bridge’s', async () => {
    const lines = readFileSync(join(exampleDir, 'coupling-schedule.csv'), 'utf8').split('\n');
    const scaled = lines.map((l, i) => {
      if (l.startsWith('#') || l === '') return l;
      const f = l.split(',');
      if (i === 2) return l.replace('Fx [N]', 'Fx [kN]').replace('b1 [mV/V]', 'b1 [V/V]');
      f[0] = String(Number(f[0]) / 1000);
      f[6] = (Number(f[6]) / 1000).toExponential(10);
      return f.join(',');
    });
    const path = variant(
      'units.yaml',
      (y) => y.replace('schedule: coupling-schedule.csv', 'schedule: ' + 'kn.csv'),
      {
        'kn.csv': scaled.join('\n'),
      },
    );
    const [a] = (await groupsOf(example)) as [MultiComponentGroup];
    const [b] = (await groupsOf(path)) as [MultiComponentGroup];
    b.calibration.sensitivity.forEach((row, i) =>
      row.forEach((s, j) => expect(s).toBeNear(a.calibration.sensitivity[i]![j]!, { rel: 1e-9 })),
    );
  });

  it('refuses a group named like a channel, a missing field, an unknown one', async () => {
    const path = variant('names.yaml', (y) =>
      y
        .replace('  stand:\n    kind: platform', '  b1:\n    kind: platform')
        .replace('interactions: second-order', 'interaction: second-order'),
    );
    const text = await problems(path);
    expect(text).toContain("groups.b1: 'b1' names a channel too");
    expect(text).toContain(
      "groups.coupling.calibration.interaction: unknown field; did you mean 'interactions'?",
    );
  });
});
