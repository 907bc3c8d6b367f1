import { designFirmwareConstants, emitCHeader, firmwareCost } from '@bridgework/firmware';

// A quarter bridge read ratiometrically over 16-bit codes (the map is linear-fractional), to 0.01 µε.
const design = designFirmwareConstants({
  name: 'Strut strain',
  exact: (code) => (2000 * (code / 32768)) / (1 + 0.004 * (code / 32768)),
  codeMin: -32768,
  codeMax: 32767,
  quantityUnit: 'µε',
  targetError: 0.01,
  outputUnit: '0.001',
});
for (const type of ['fixed', 'float32', 'float64'] as const) {
  const map = design[type]!;
  const total = design.totals![type]!;
  console.log(`${type}: ${map.kind}, ${firmwareCost(map).tableBytes} bytes, total error ${total.bound.toPrecision(2)} µε (${total.proved ? 'proved' : 'measured'})`);
}
const header = emitCHeader({ channels: [design], prefix: 'strut' });
console.log(header.split('\n').find((line) => line.startsWith('static inline int32_t')));
