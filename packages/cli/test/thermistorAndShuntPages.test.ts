/**
 * `bridgework fit-thermistor` end to end on the test day's bath points (JSON against the
 * compensation package's `fitThermistor` called directly, the write-back, the failed check), and
 * the HTML pages of `shunt-plan` and `shunt-apply` (their plots and the caution).
 */
import { copyFileSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { fitThermistor } from '@bridgework/compensation';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { loadChannels } from '../src/channels/loadChannels.js';
import { formatStated } from '../src/report/formatNumber.js';
import { memoryIo } from './support/memoryIo.js';
import { useTempDir } from './support/tempDir.js';

const exampleDir = fileURLToPath(new URL('../../../examples/test-day/', import.meta.url));
const tmp = useTempDir('thermistor');
const env = { SOURCE_DATE_EPOCH: '1796342400', NO_COLOR: '1' };

async function run(...argv: string[]) {
  const io = memoryIo({ env });
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

function copy(...names: string[]): (name: string) => string {
  const dir = tmp();
  for (const n of names) copyFileSync(join(exampleDir, n), join(dir, n));
  return (name) => join(dir, name);
}

/** The bath points as the file holds them. */
function bathPoints(file: string) {
  return readFileSync(file, 'utf8')
    .split('\n')
    .filter((l) => /^-?\d/.test(l))
    .map((l) => {
      const [t, r] = l.split(',').map(Number);
      return { temperatureCelsius: t!, ohms: r! };
    });
}

describe('fit-thermistor', () => {
  it('Steinhart–Hart and beta as fitThermistor gives them, with the residuals; --write sets the sensor', async () => {
    const at = copy('slipway-winch.yaml', 'tie-thermistor-points.csv');
    const points = bathPoints(at('tie-thermistor-points.csv'));
    const sh = await run(
      'fit-thermistor',
      at('slipway-winch.yaml'),
      at('tie-thermistor-points.csv'),
      '-c',
      'tie-temperature',
      '--json',
    );
    expect(sh.code).toBe(exitCodes.ok);
    const j = JSON.parse(sh.stdout);
    const lib = fitThermistor({ model: 'steinhart-hart', points });
    expect(j.steinhartHart).toEqual(lib.steinhartHart);
    expect(j.residualsKelvin).toEqual(lib.residualsKelvin);
    expect(j.caution).toMatch(/do not replace, qualified engineering judgement/);
    const beta = await run(
      'fit-thermistor',
      at('slipway-winch.yaml'),
      at('tie-thermistor-points.csv'),
      '-c',
      'tie-temperature',
      '--model',
      'beta',
      '--max-residual',
      '1',
      '--json',
    );
    expect(beta.code).toBe(exitCodes.ok);
    // The channel's sensor.referenceCelsius (25 °C by default) is the beta's t0.
    expect(JSON.parse(beta.stdout).beta).toEqual(
      fitThermistor({ model: 'beta', points, referenceCelsius: 25 }).beta,
    );

    const text = await run(
      'fit-thermistor',
      at('slipway-winch.yaml'),
      at('tie-thermistor-points.csv'),
      '-c',
      'tie-temperature',
    );
    expect(text.code).toBe(exitCodes.ok);
    await expect(text.stdout.replaceAll(at(''), '<dir>')).toMatchFileSnapshot(
      './__snapshots__/test-day-fit-thermistor.txt',
    );
    const before = readFileSync(at('slipway-winch.yaml'), 'utf8');
    const w = await run(
      'fit-thermistor',
      at('slipway-winch.yaml'),
      at('tie-thermistor-points.csv'),
      '-c',
      'tie-temperature',
      '--write',
    );
    expect(w.code).toBe(exitCodes.ok);
    expect(w.stdout).toMatch(/wrote the Steinhart–Hart model into the sensor section/);
    const after = readFileSync(at('slipway-winch.yaml'), 'utf8');
    // Only the thermistor's sensor line changed (a flow mapping, rewritten alone).
    const changed = after.split('\n').filter((l) => !before.split('\n').includes(l));
    expect(changed).toHaveLength(1);
    expect(changed[0]).toMatch(
      /^ {4}sensor: \{ kind: thermistor, referenceOhms: 10 kΩ, steinhartHart: \{ a: /,
    );
    const loaded = await loadChannels(at('slipway-winch.yaml'), ['tie-temperature']);
    const channel = loaded.channels[0]!.channel;
    expect((channel.spec.sensor as { steinhartHart?: unknown }).steinhartHart).toEqual(lib.steinhartHart);
    expect((channel.spec.sensor as { betaKelvin?: number }).betaKelvin).toBeUndefined();
    // The channel now reads the bath's temperatures through the fitted curve (its bridge, its code).
    for (const p of points) {
      const code = channel.exactCodeFromQuantity(p.temperatureCelsius);
      expect(channel.quantityFromCode(code)).toBeNear(p.temperatureCelsius, { abs: 1e-6 });
    }
  });

  it('a residual past --max-residual fails (exit 2) and writes nothing; refusals in the user’s terms', async () => {
    const at = copy('slipway-winch.yaml', 'tie-thermistor-points.csv');
    const before = readFileSync(at('slipway-winch.yaml'), 'utf8');
    const r = await run(
      'fit-thermistor',
      at('slipway-winch.yaml'),
      at('tie-thermistor-points.csv'),
      '-c',
      'tie-temperature',
      '--model',
      'beta',
      '--write',
    );
    expect(r.code).toBe(exitCodes.failedCheck);
    expect(r.stdout).toMatch(
      /check failed: a residual exceeds --max-residual 0\.1 K: try --model steinhart-hart/,
    );
    expect(readFileSync(at('slipway-winch.yaml'), 'utf8')).toBe(before);
    const cases: [string[], RegExp][] = [
      [['-c', 'tie'], /channel 'tie' is a strain-gauge channel: fit-thermistor writes a thermistor's model/],
      [
        ['-c', 'tie-temperature', '--reference-celsius', '20'],
        /--reference-celsius applies to --model beta only/,
      ],
      [['-c', 'tie-temperature', '--temperature-unit', 'kN'], /--temperature-unit 'kN'/],
    ];
    for (const [args, message] of cases) {
      const e = await run(
        'fit-thermistor',
        at('slipway-winch.yaml'),
        at('tie-thermistor-points.csv'),
        ...args,
      );
      expect(e.stderr).toMatch(message);
      expect(e.code).toBe(exitCodes.badInput);
    }
  });
});

describe('small tables of the test day', () => {
  it('a header naming its unit is refused with the header as written and the way out, never read as if the unit were known', async () => {
    const at = copy('slipway-winch.yaml');
    const points = at('kiln-points.csv');
    writeFileSync(points, 'Temperature (°F),Resistance (Ω)\n32,33656\n77,10009\n140,2488\n');
    const r = await run('fit-thermistor', at('slipway-winch.yaml'), points, '-c', 'tie-temperature');
    expect(r.code).toBe(exitCodes.badInput);
    expect(r.stderr).toContain("it names 'Temperature (°F)', 'Resistance (Ω)'");
    expect(r.stderr).toContain("write 'temperature' without the unit in brackets ('Temperature (°F)')");
  });
});

describe('shunt pages', () => {
  it('shunt-plan --html: per channel the plan and the indicated quantity against the resistor', async () => {
    const at = copy('slipway-winch.yaml');
    const r = await run('shunt-plan', at('slipway-winch.yaml'), '--html', at('plan.html'));
    expect(r.code).toBe(exitCodes.ok);
    const page = readFileSync(at('plan.html'), 'utf8');
    expect(page).toMatch(/data-plot="shunt-plan-rope"[^>]*data-series-count="3"/);
    expect(page).toMatch(/data-plot="shunt-plan-tie"[^>]*data-series-count="3"/);
    expect(page).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
    // The page's exact shunt is the text report's.
    const text = await run('shunt-plan', at('slipway-winch.yaml'), '-c', 'tie', '--json');
    const plan = JSON.parse(text.stdout).plans[0];
    expect(page).toContain(`${formatStated(plan.exact.shuntOhms)} Ω`);
  });

  it('shunt-apply --html: the steps, the check and the readings', async () => {
    const at = copy('slipway-winch.yaml', 'tie-shunt-readings.csv');
    const r = await run(
      'shunt-apply',
      at('slipway-winch.yaml'),
      '-c',
      'tie',
      '--shunt-ohms',
      '140000',
      '--readings',
      at('tie-shunt-readings.csv'),
      '--html',
      at('apply.html'),
    );
    expect(r.code).toBe(exitCodes.ok);
    const page = readFileSync(at('apply.html'), 'utf8');
    expect(page).toMatch(/data-plot="shunt-readings-tie"[^>]*data-series-count="3"/);
    expect(page).toMatch(/span error/);
    expect(page).toMatch(/support, and do not replace,\s+qualified engineering judgement/);
    const same = await run(
      'shunt-apply',
      at('slipway-winch.yaml'),
      '-c',
      'tie',
      '--shunt-ohms',
      '140000',
      '--zero-code',
      '1',
      '--shunted-code',
      '-660000',
      '--html',
      at('apply.html'),
    );
    expect(same.stderr).toMatch(/apply\.html/);
    expect(same.code).toBe(exitCodes.badInput);
  });
});
