/**
 * Reports that say what was computed (issue 15 items 19, 21, 22): resolution figures named by
 * what they are with their formulas, numerical dust shown as `< limit` with no curve drawn of it,
 * and labels that match the figure (nonlinearity over the span, power in an arm with its lead,
 * no expanded uncertainty on a standard-uncertainty axis, a unit on every limit in the budget's
 * model column).
 */
import { readFileSync } from 'node:fs';
import { channelBudget, createChannel } from '@bridgework/channel';
import { describe, expect, it } from 'vitest';
import { exitCodes } from '../src/exitCodes.js';
import { runCli } from '../src/runCli.js';
import { exampleShown, footbridgeSpecs } from './support/footbridge.js';
import { useTestFiles } from './support/files.js';
import { memoryIo } from './support/memoryIo.js';

const { outPath } = useTestFiles('wording');
const transducer = 'packages/cli/test/fixtures/minimal/transducer.yaml';

async function run(...argv: string[]) {
  const io = memoryIo();
  const code = await runCli(argv, io);
  return { code, stdout: io.stdout.text(), stderr: io.stderr.text() };
}

const section = (text: string, name: string): string => {
  const start = text.indexOf(`\n${name}:`);
  const end = text.indexOf('\n\n', text.indexOf('largest power', start));
  return text.slice(start, end);
};

describe('report wording', () => {
  it('names the two resolution figures by what they are, with their formulas and values (IEEE 1241)', async () => {
    const { stdout } = await run('report', exampleShown);
    const budget = channelBudget(createChannel(footbridgeSpecs['gusset-g2']));
    const text = section(stdout, 'gusset-g2').replace(/\s+/g, ' ');
    expect(text).not.toMatch(/\beffective bits\b/);
    expect(text).toContain(
      `rms-based resolution ${budget.resolution.effectiveBits.toFixed(1)} bits = log2(FSR / (√12·σ)) (effective number of bits, IEEE 1241)`,
    );
    expect(text).toContain(
      `peak-to-peak-based resolution ${budget.resolution.noiseFreeBits.toFixed(1)} bits = log2(FSR / (6.6·σ)) (noise-free bits)`,
    );
    expect(text).toContain("FSR is the converter's full-scale range and σ the total rms noise at its input");
    // The two figures differ by log2(6.6/√12) bits, as their formulas say (a check of the pair).
    expect(budget.resolution.effectiveBits - budget.resolution.noiseFreeBits).toBeNear(
      Math.log2(6.6 / Math.sqrt(12)),
      { abs: 1e-12 },
    );
  });

  it('shows numerical dust as "< limit" (10⁻¹² of the span), never as a value', async () => {
    const { stdout } = await run('report', exampleShown);
    const hanger = section(stdout, 'hanger-h3');
    // Six-wire sensing: the lead desensitization is exactly zero; the library's double arithmetic
    // leaves a residue far below 10⁻¹² of the 130 kN span.
    const budget = channelBudget(createChannel(footbridgeSpecs['hanger-h3']));
    const lead = budget.lines.find((l) => l.name === 'lead desensitization');
    expect(Math.abs(lead?.value ?? 1)).toBeLessThan(1e-12 * 130e3);
    expect(hanger).toMatch(/lead desensitization\s+< 1\.3e−10\s+—\s+informative/);
    expect(hanger).not.toMatch(/e−1[3-9]/);
  });

  it('draws no nonlinearity curve of a linear map, and says why', async () => {
    const html = outPath('linear.html');
    const r = await run('report', transducer, '--html', html);
    expect(r.code).toBe(exitCodes.ok);
    const page = readFileSync(html, 'utf8');
    expect(page).not.toMatch(/data-plot="[^"]*-nonlinearity"/);
    expect(page).toMatch(
      /The exact map is linear: it departs from the terminal line by less than [^<]+ \(10⁻¹² of the span/,
    );
    // The example's maps are not linear: their curves stay.
    const example = outPath('example.html');
    await run('report', exampleShown, '--html', example);
    expect(readFileSync(example, 'utf8').match(/data-plot="[^"]*-nonlinearity"/g)).toHaveLength(3);
  });

  it('labels the nonlinearity as the largest deviation over the span, and the power as that of an arm with its lead', async () => {
    const { stdout } = await run('report', exampleShown);
    expect(stdout).toMatch(/nonlinearity of a linear map \(largest over the span\)/);
    expect(stdout).not.toMatch(/largest power in one gauge/);
    expect(section(stdout, 'gusset-g2')).toMatch(
      /largest power in one bridge arm holding a sensing element, with its lead wire: 4\.43 mW/,
    );
    expect(section(stdout, 'deck-temp')).toMatch(
      /largest power in one bridge arm holding a sensing element, with its lead wire:/,
    );
    const t = await run('report', transducer);
    expect(t.stdout).toMatch(/largest power in one bridge arm holding a sensing element: /);
  });

  it('draws only standard uncertainties on the error budget\'s "Standard uncertainty" axis', async () => {
    const html = outPath('budget.html');
    await run('report', exampleShown, '--html', html);
    const page = readFileSync(html, 'utf8');
    const chart = /<svg [^>]*data-plot="gusset-g2-budget"[\s\S]*?<\/svg>/.exec(page)?.[0] ?? '';
    expect(chart).toContain('Standard uncertainty (µε)');
    const categories = [...chart.matchAll(/data-category="([^"]*)"/g)].map((m) => m[1]);
    expect(categories).toContain('combined standard uncertainty');
    expect(categories.some((c) => /expanded/.test(c ?? ''))).toBe(false);
    // The expanded uncertainty is named in the title, with its coverage probability.
    expect(chart).toMatch(/expanded uncertainty 18\.9 µε, 95 %/);
  });

  it("states a unit with every limit in the budget's model column (item 22)", () => {
    // Every channel of the demo and one of each sensor kind with all its tolerances set: each
    // ±limit in a line's model text is followed by its unit (%, Ω, K, °C …), and the RTD's class
    // formula ±(a + b·|t|) by °C.
    const specs = [
      ...Object.values(footbridgeSpecs),
      {
        sensor: {
          kind: 'transducer',
          ratedOutputVoltsPerVolt: 2e-3,
          capacity: '500 kN',
          ratedOutputToleranceFraction: 0.001,
        },
        excitation: { volts: 5 },
        amplifier: { gain: 128 },
        tolerances: { gainFraction: 2e-4 },
        adc: { bits: 24, referenceVolts: 5, ratiometric: true },
        output: { quantity: 'force', unit: 'kN' },
      },
      {
        sensor: {
          kind: 'thermistor',
          referenceOhms: 10000,
          betaKelvin: 3950,
          referenceOhmsToleranceFraction: 0.01,
          betaToleranceFraction: 0.01,
        },
        excitation: { volts: 2.5 },
        adc: { bits: 24, referenceVolts: 2.5, ratiometric: true },
        output: { quantity: 'temperature', range: ['0 °C', '80 °C'] },
      },
    ];
    let limits = 0;
    for (const spec of specs) {
      const budget = channelBudget(createChannel(spec as Parameters<typeof createChannel>[0]));
      for (const line of budget.lines) {
        for (const m of line.model.matchAll(/±\s*(\([^)]*\)|[0-9][0-9.,e+−-]*)/g)) {
          limits++;
          const after = line.model.slice((m.index as number) + m[0].length);
          expect(after, `${line.model}`).toMatch(
            /^[\s\u00a0]*(%|Ω|K\b|°C|°F|V\b|mV|µε|kN|N\b|t\b|kg|Pa|kPa|MPa|bar)/,
          );
        }
      }
    }
    expect(limits).toBeGreaterThanOrEqual(8); // the test reads real limits, not none
  });
});
