/** Test helper: seeded random mutations of a channel file's text, for the channel-file fuzz. */

/** mulberry32: a small seeded generator, so a failing case can be replayed from its index. */
export function generator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const values = [
  '0',
  '-1',
  '1',
  '-0',
  '24.5',
  '1e400',
  '-1e400',
  '1e-400',
  '1e308',
  '5e-324',
  '2147483648',
  '.nan',
  '.inf',
  '-.inf',
  "''",
  '""',
  'x',
  'null',
  '~',
  'true',
  '[]',
  '{}',
  '[1]',
  '[1, 2, 3]',
  '{ a: 1 }',
  '5 V',
  '5 kV',
  '350 ohm',
  '350 m',
  '1e3 kohm',
  '20 t',
  '500 kN',
  '-5 degC',
  '0.5 %',
  '3 ppm',
  "'2*2.5 V'",
  '1/0',
  '0x10',
  '1_000',
  '"\\u0000"',
  '&a 5',
  '*a',
  '!!str 5',
  '!include x',
  '[-1e400, 1e400]',
  '[0, 0]',
  '[1, -1]',
  'quarter',
  'full-bending',
  'rtd',
  'strain-gauge',
  'transducer',
  'force',
  'mass',
  'strain',
  'temperature',
  'stress',
  'A',
  'D',
  'sinc3',
  'sinc4',
  'two-wire',
  'three-wire',
  'six-wire',
];
const keys = [
  'constructor',
  '__proto__',
  'toString',
  'hasOwnProperty',
  'valueOf',
  'name',
  'kind',
  'volts',
  'volt',
  'gain',
  'bits',
  'range',
  'sensor',
  'bridge',
  'adc',
  'output',
  'tolerances',
  'zero',
  'cable',
  'x',
  'channels',
  'project',
  '$schema',
  '',
  '"a b"',
  '? [a]',
  '<<',
];
const inserts = [
  ':',
  ' ',
  '\t',
  '[',
  ']',
  '{',
  '}',
  ',',
  '&a ',
  '*a',
  '#',
  '"',
  "'",
  '-',
  '\n',
  '|',
  '>',
  '%',
  '@',
  '`',
  '!',
];

export function mutate(text: string, random: () => number): string {
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)] as T;
  let lines = text.split('\n');
  const steps = 1 + Math.floor(random() * 3);
  for (let s = 0; s < steps; s++) {
    const i = Math.floor(random() * lines.length);
    if (lines.length === 0) lines = [''];
    const line = lines[i] ?? '';
    switch (Math.floor(random() * 9)) {
      case 0: {
        // Replace a value: after `key:` or inside a flow mapping.
        const m = /^(.*?:\s*)([^{}[\],#]+?)(\s*(?:[,}\]].*)?)$/.exec(line);
        if (m !== null) lines[i] = `${m[1]}${pick(values)}${m[3]}`;
        else lines[i] = `${line} ${pick(values)}`;
        break;
      }
      case 1: {
        // Replace one value inside a flow mapping `{ a: 1, b: 2 }`.
        const parts = line.split(/(:\s*[^,}]+)/);
        const idx = parts.findIndex((p, k) => k % 2 === 1 && random() < 0.5);
        if (idx > 0) parts[idx] = `: ${pick(values)}`;
        lines[i] = parts.join('');
        break;
      }
      case 2:
        lines.splice(i, 1);
        break;
      case 3:
        lines.splice(i, 0, line);
        break;
      case 4: {
        const m = /^(\s*)([\w$-]+)(\s*:.*)$/.exec(line);
        if (m !== null) lines[i] = `${m[1]}${pick(keys)}${m[3]}`;
        else lines[i] = line.replace(/(\{\s*)([\w$-]+)/, (_a, b: string) => `${b}${pick(keys)}`);
        break;
      }
      case 5:
        lines[i] = random() < 0.5 ? `  ${line}` : line.replace(/^ {1,2}/, '');
        break;
      case 6: {
        const at = Math.floor(random() * (line.length + 1));
        lines[i] = `${line.slice(0, at)}${pick(inserts)}${line.slice(at)}`;
        break;
      }
      case 7: {
        const j = Math.floor(random() * lines.length);
        [lines[i], lines[j]] = [lines[j] as string, line];
        break;
      }
      default:
        lines = lines.slice(0, Math.max(1, i));
    }
  }
  return lines.join('\n');
}
