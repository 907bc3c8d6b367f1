/**
 * Child process for the write-back tests: opens the channel file given, sets a span-correction
 * section, prints `saving <length of the new text>` and saves (the parent kills it meanwhile).
 */
import { openChannelFileEditor, setChannelSection } from '../../src/channelFile/editChannelFile.js';

const path = process.argv[2] as string;
const editor = await openChannelFileEditor(path);
setChannelSection(editor, 'hook', 'spanCorrection', { factor: 1.0021, date: '2025-06-03' });
process.stdout.write(`saving ${editor.text().length}\n`);
await editor.save({ validate: false });
process.stdout.write('saved\n');
