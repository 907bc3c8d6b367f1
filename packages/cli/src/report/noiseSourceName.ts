const names: Readonly<Record<string, string>> = {
  'bridge-thermal': 'bridge thermal (Johnson) noise',
  'amplifier-voltage': 'amplifier voltage noise',
  'amplifier-current': 'amplifier current noise',
  'amplifier-output': 'amplifier output noise',
  quantization: 'quantization (q/√12)',
  adc: 'converter noise',
};

/**
 * A noise source of the chain package in words (`'bridge-thermal'` → `'bridge thermal (Johnson) noise'`).
 *
 * @param source - The source's name in the budget.
 * @returns The words (the name itself when unknown).
 */
export function noiseSourceName(source: string): string {
  return names[source] ?? source;
}
