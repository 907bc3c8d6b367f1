/**
 * Writing back into a channel file: the section set is the only text that changes (comments,
 * unusual formatting and line endings elsewhere kept byte for byte), the result reads back as
 * intended, a file changed since it was read is refused, and a write killed at any moment leaves
 * either the old file or the new one, never a mix.
 */
import {
  mkdirSync,
  readdirSync,
  readFileSync,
  statSync,
  symlinkSync,
  chmodSync,
  writeFileSync,
} from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parseDocument } from 'yaml';
import { openChannelFileEditor, setChannelSection } from '../src/channelFile/editChannelFile.js';
import { caught } from './support/caught.js';
import { exited, spawnTs, waitForLine } from './support/spawnChild.js';
import { useTempDir } from './support/tempDir.js';

const tmp = useTempDir('edit');
let n = 0;
const write = (name: string, text: string): string => {
  const dir = join(tmp(), `case-${++n}`);
  mkdirSync(dir);
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
};

/** A valid channel file written the way people write: comments everywhere, four-space indents, flow maps, odd spacing, quotes. */
const unusual = `# Crane hook, proof-load test (an invented scenario)
#   hand-written: comments, 4-space indents, flow maps, odd spacing
channels:
    hook:    # the main hook's load cell
        sensor:   { kind: transducer,  capacity: "50 t",  ratedOutputVoltsPerVolt: 2 mV/V }   # certificate 0117
        bridge:
            wiring:   six-wire

        excitation: { volts: 10 V }
        adc:
            bits: 24
            referenceVolts: 10 V   # = excitation
            ratiometric: true
        output:
            quantity: 'force'
            range: [ 0 kN , 600 kN ]
        # end of hook
    ambient:
      sensor: {kind: thermistor, referenceOhms: 10 kΩ, betaKelvin: 3950}
      excitation: {volts: 2.5 V}
      adc: {bits: 24, referenceVolts: 2.5 V, ratiometric: true}
      output: {quantity: temperature, range: [-20, 60]}
# the end
`;

const span = {
  factor: 1.0021,
  date: '2025-06-03',
  shunt: { ohms: 59_000, arm: 1 },
  readings: [1, 2.5, -3e-7],
};

/** The text with the lines of one inserted block removed. */
function without(text: string, block: string): string {
  expect(text.includes(block)).toBe(true);
  return text.replace(block, '');
}

describe('openChannelFileEditor on YAML', () => {
  it('adds a section at the end of a channel and changes no other byte', async () => {
    const path = write('hook.yaml', unusual);
    const editor = await openChannelFileEditor(path);
    setChannelSection(editor, 'hook', 'spanCorrection', span, { comment: 'written by a test' });
    const text = editor.text();
    const block = `        # written by a test
        spanCorrection:
            factor: 1.0021
            date: '2025-06-03'
            shunt:
                ohms: 59000
                arm: 1
            readings: [1, 2.5, -3e-7]
`;
    // Inserted after the channel's last entry (before the comment that closes it), in the file's
    // own indentation; everything else is the original text.
    expect(without(text, block)).toBe(unusual);
    expect(text.indexOf(block)).toBe(unusual.indexOf('        # end of hook'));
    await editor.save({ validate: false });
    expect(readFileSync(path, 'utf8')).toBe(text);
    const data = parseDocument(text).toJS() as { channels: { hook: Record<string, unknown> } };
    expect(data.channels.hook['spanCorrection']).toEqual(span);
    expect(readdirSync(join(path, '..'))).toEqual(['hook.yaml']);
  });

  it('replaces an existing section and keeps the comment above it and the text after it', async () => {
    const first = `${unusual.replace('        # end of hook\n', '')}`.replace(
      '    ambient:',
      '        # shunt check of 2 June\n        spanCorrection: { factor: 0.998, date: 2025-06-02 }   # old\n    ambient:',
    );
    const path = write('hook.yaml', first);
    const editor = await openChannelFileEditor(path);
    editor.set(['channels', 'hook', 'spanCorrection'], { factor: 1.0021, date: '2025-06-03' });
    const text = editor.text();
    expect(text).toBe(
      first.replace(
        'spanCorrection: { factor: 0.998, date: 2025-06-02 }   # old',
        "spanCorrection:\n            factor: 1.0021\n            date: '2025-06-03'   # old",
      ),
    );
    expect(text).toContain('        # shunt check of 2 June\n');
  });

  it('replaces a block section with a block section, leaving the lines around it alone', async () => {
    const path = write('hook.yaml', unusual);
    const editor = await openChannelFileEditor(path);
    editor.set(['channels', 'hook', 'output'], { quantity: 'force', unit: 'kN', range: [0, 600] });
    expect(editor.text()).toBe(
      unusual.replace(
        "        output:\n            quantity: 'force'\n            range: [ 0 kN , 600 kN ]\n",
        '        output:\n            quantity: force\n            unit: kN\n            range: [0, 600]\n',
      ),
    );
  });

  it('edits a channel written as a flow mapping inside the block file, and a top-level section', async () => {
    const path = write('hook.yaml', unusual);
    const editor = await openChannelFileEditor(path);
    editor.set(['channels', 'ambient', 'sensor'], {
      kind: 'thermistor',
      referenceOhms: 10_000,
      steinhartHart: { a: 1.1e-3, b: 2.4e-4, c: 8.7e-8 },
    });
    editor.set(['project'], { title: 'Crane hook' });
    const text = editor.text();
    expect(text.startsWith(unusual.slice(0, unusual.indexOf('    ambient:')))).toBe(true);
    // A new top-level section goes after the last one, before the file's closing comment.
    expect(
      text.endsWith(
        '      output: {quantity: temperature, range: [-20, 60]}\nproject:\n    title: Crane hook\n# the end\n',
      ),
    ).toBe(true);
    expect(text).toContain(
      '    ambient:\n      sensor:\n        kind: thermistor\n        referenceOhms: 10000\n        steinhartHart:\n          a: 0.0011\n',
    );
    const data = editor.data() as { channels: { ambient: { sensor: unknown; adc: unknown } } };
    expect(data.channels.ambient.sensor).toEqual({
      kind: 'thermistor',
      referenceOhms: 10_000,
      steinhartHart: { a: 1.1e-3, b: 2.4e-4, c: 8.7e-8 },
    });
    expect(data.channels.ambient.adc).toEqual({ bits: 24, referenceVolts: '2.5 V', ratiometric: true });
    await editor.save();
  });

  it('keeps CRLF line endings and writes the new lines with them', async () => {
    const crlf = unusual.replace(/\n/g, '\r\n');
    const path = write('hook.yaml', crlf);
    const editor = await openChannelFileEditor(path);
    setChannelSection(editor, 'hook', 'calibration', { degree: 1, coefficients: [0.5, 2] });
    const text = editor.text();
    expect(text.replace(/\r\n/g, '')).not.toContain('\n');
    expect(
      without(
        text,
        '        calibration:\r\n            degree: 1\r\n            coefficients: [0.5, 2]\r\n',
      ),
    ).toBe(crlf);
  });

  it('writes numbers that read back as the same doubles, and removes a section', async () => {
    const path = write('hook.yaml', unusual);
    const editor = await openChannelFileEditor(path);
    const values = [0.1, 1 / 3, -2.5e-300, 6.02214076e23, 5e-324, 123456789012345680000, -0];
    setChannelSection(editor, 'hook', 'calibration', { coefficients: values });
    const back = (parseDocument(editor.text()).toJS() as { channels: { hook: { calibration: unknown } } })
      .channels.hook.calibration as { coefficients: number[] };
    back.coefficients.forEach((v, i) => expect(Object.is(v, values[i])).toBe(true));
    editor.remove(['channels', 'hook', 'calibration']);
    expect(editor.text()).toBe(unusual);
  });

  it('refuses bad paths and values that YAML or JSON cannot carry exactly', async () => {
    const editor = await openChannelFileEditor(write('hook.yaml', unusual));
    expect(() => editor.set([], 1)).toThrowBridgeworkError('invalid-option', { param: 'path' });
    expect(() => editor.set(['channels', 'hook', 'output', 'quantity', 'x'], 1)).toThrowBridgeworkError(
      'invalid-option',
      { param: 'path' },
    );
    expect(() => editor.set(['channels', 'hook', 'x'], { a: Number.NaN })).toThrowBridgeworkError(
      'not-finite',
      {
        param: 'channels.hook.x.a',
      },
    );
    expect(() => editor.set(['channels', 'hook', 'x'], new Date())).toThrowBridgeworkError('wrong-type');
    expect(() => editor.set(['channels', '__proto__'], {})).toThrowBridgeworkError('invalid-option');
    expect(() => setChannelSection(editor, 'hok', 'x', 1)).toThrowBridgeworkError('invalid-option', {
      param: 'channel',
    });
    expect(editor.text()).toBe(unusual);
  });

  it('refuses to save a file that would not be a valid channel file, and writes nothing', async () => {
    const path = write('hook.yaml', unusual);
    const editor = await openChannelFileEditor(path);
    setChannelSection(editor, 'hook', 'adc', { bits: 'many' });
    expect(await caught(editor.save())).toThrowBridgeworkError('invalid-spec');
    expect(readFileSync(path, 'utf8')).toBe(unusual);
  });
});

describe('saving', () => {
  it('refuses a file changed since it was read, and leaves the other change in place', async () => {
    const path = write('hook.yaml', unusual);
    const editor = await openChannelFileEditor(path);
    setChannelSection(editor, 'hook', 'spanCorrection', span);
    const theirs = `${unusual}# edited meanwhile\n`;
    writeFileSync(path, theirs);
    const e = await caught(editor.save({ validate: false }));
    expect(e).toThrowBridgeworkError('io-error', { param: path });
    expect(e).toThrow(/changed since it was read .*nothing was written/);
    expect(readFileSync(path, 'utf8')).toBe(theirs);
    expect(readdirSync(join(path, '..'))).toEqual(['hook.yaml']);
  });

  it('keeps the permission bits and writes through a symbolic link to its target', async () => {
    const path = write('hook.yaml', unusual);
    chmodSync(path, 0o640);
    const link = join(path, '..', 'link.yaml');
    symlinkSync(path, link);
    const editor = await openChannelFileEditor(link);
    setChannelSection(editor, 'hook', 'spanCorrection', span);
    await editor.save({ validate: false });
    expect(statSync(path).mode & 0o777).toBe(0o640);
    expect(readFileSync(link, 'utf8')).toBe(editor.text());
    expect(statSync(link, { throwIfNoEntry: true }).isFile()).toBe(true);
  });

  it('JSON files keep their key order and indentation', async () => {
    const json = `{\n    "channels": {\n        "hook": {\n            "sensor": { "kind": "transducer", "capacity": "50 t", "ratedOutputVoltsPerVolt": 0.002 },\n            "excitation": { "volts": 10 },\n            "adc": { "bits": 24, "referenceVolts": 10, "ratiometric": true },\n            "output": { "quantity": "force", "range": [0, 600000] }\n        }\n    }\n}\n`;
    const path = write('hook.json', json);
    const editor = await openChannelFileEditor(path);
    setChannelSection(editor, 'hook', 'zero', { code: 1234.5 });
    await editor.save();
    const text = readFileSync(path, 'utf8');
    expect(text).toMatch(/^\{\n {4}"channels": \{\n {8}"hook": \{\n {12}"sensor"/);
    expect(Object.keys((JSON.parse(text) as { channels: { hook: object } }).channels.hook)).toEqual([
      'sensor',
      'excitation',
      'adc',
      'output',
      'zero',
    ]);
  });

  it('killed at any moment of a save (SIGKILL), the file is the old one or the new one, never a mix', async () => {
    // A channel file near the size limit, so the write takes a while; the kill lands at a random
    // moment after the child says it is saving.
    const filler = `${'# a long comment line to make the file large enough to take time to write ..........\n'.repeat(9000)}`;
    const old = `${filler}${unusual}`;
    const child = fileURLToPath(new URL('./support/editChild.ts', import.meta.url));
    let replaced = 0;
    for (let i = 0; i < 3; i++) {
      const path = write('hook.yaml', old);
      const p = spawnTs(child, [path]);
      const m = await waitForLine(p, /^saving (\d+)$/);
      const newLength = Number(m[1]);
      await new Promise((r) => setTimeout(r, i * 4));
      p.kill('SIGKILL');
      await exited(p);
      const now = readFileSync(path, 'utf8');
      if (now !== old) {
        replaced++;
        expect(now.length).toBe(newLength);
        // The new file is the old one with the section added (before the comment that ends the channel).
        expect(
          without(
            now,
            "        spanCorrection:\n            factor: 1.0021\n            date: '2025-06-03'\n",
          ),
        ).toBe(old);
      }
      for (const f of readdirSync(join(path, '..')))
        expect(f).toMatch(/^(hook\.yaml|\.hook\.yaml\.\d+-[0-9a-f]{8}\.tmp)$/);
    }
    expect(replaced).toBeLessThanOrEqual(3);
  }, 180_000);
});
