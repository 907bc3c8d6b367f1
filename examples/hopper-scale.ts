/**
 * Hopper scale: generate the firmware constants of a batching-hopper weighing channel, with their
 * proved error bounds, and the C header that examples/hopper-scale/hopper-scale.c uses.
 *
 * Scenario (invented): see examples/hopper-scale/scenario.ts.
 *
 * Run: pnpm exec tsx --conditions=@bridgework/source examples/hopper-scale.ts [--out DIR]
 * With --out, writes DIR/hopper_scale.h (the copy in examples/hopper-scale/ is kept current by a
 * test). Then build the program: gcc -std=c99 -Wall -Wextra -Wconversion -Werror -pedantic
 *   -I DIR examples/hopper-scale/hopper-scale.c -o hopper-scale && ./hopper-scale 8421 1082645
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { emitCHeader, FIRMWARE_CAUTION } from '@bridgework/firmware';
import {
  capacityKg,
  codesPerRatio,
  deadLoadCode,
  displayStepKg,
  fullLoadCode,
  fullScaleCodes,
  hopperChannel,
  ratedOutputMillivoltsPerVolt,
  scaleKgPerCode,
} from './hopper-scale/scenario.js';

const channel = hopperChannel();
const fixed = channel.fixed;
const f32 = channel.float32;
const lines: string[] = [];
lines.push('bridgework example: batching-hopper scale, firmware constants (invented scenario)');
lines.push('');
lines.push(
  `Cells: ${capacityKg} kg at ${ratedOutputMillivoltsPerVolt} mV/V; 24-bit bipolar, ratiometric, gain 128.`,
);
lines.push(`Codes per V/V: 128 * 2^23 = ${codesPerRatio}; full load = ${fullScaleCodes} codes.`);
lines.push(
  `Scale ${scaleKgPerCode} kg per code; dead load at code ${deadLoadCode}; output step ${displayStepKg} kg.`,
);
lines.push('');
lines.push('Fixed point (int32 output in 0.01 kg):');
lines.push(
  `  multiplier ${fixed.multiplier}, shift ${fixed.shift} (${fixed.qFormat.text}), offset code ${fixed.offsetCode}, bias ${fixed.bias}`,
);
lines.push(`  exact multiplier ${fixed.source.multiplierExact}`);
lines.push(
  `  outputs ${fixed.outputRange.min} ... ${fixed.outputRange.max}; accumulator within +-${fixed.accumulatorLimit}`,
);
lines.push(
  `  max error ${fixed.maxAbsError.toPrecision(6)} LSB (${fixed.verification.method}, ${fixed.verification.codesChecked} codes); analytic bound ${fixed.errorBound.toPrecision(6)} LSB`,
);
lines.push('Float32:');
lines.push(`  scale ${f32.kind === 'affine' ? f32.scale : NaN}, offset ${f32.offset}`);
lines.push(
  `  max error ${f32.maxAbsError.toPrecision(6)} kg (${f32.verification.method}, ${f32.verification.codesChecked} codes)`,
);
lines.push('');
lines.push(
  `Full load: code ${fullLoadCode} reads ${fixed.evaluate(fullLoadCode)} x 0.01 kg (fixed point), ${f32.evaluate(fullLoadCode)} kg (float32).`,
);
lines.push('Not a verified weighing instrument: trade use needs type approval and verification.');
lines.push(`Caution: ${FIRMWARE_CAUTION}`);

const out = process.argv.indexOf('--out');
if (out >= 0) {
  const dir = process.argv[out + 1];
  if (dir === undefined) throw new Error('--out needs a directory');
  const file = join(dir, 'hopper_scale.h');
  writeFileSync(file, emitCHeader({ channels: [channel], prefix: 'hopper' }));
  lines.push(`Wrote ${file}.`);
}
console.log(lines.join('\n'));
