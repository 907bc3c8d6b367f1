/**
 * Child process for the atomic-file tests: opens an output file atomically, writes part of it,
 * prints `ready <temp path>` and waits to be killed.
 */
import { openAtomicFile } from '../../src/files/atomicFile.js';

const target = process.argv[2] as string;
const file = await openAtomicFile(target);
await file.write('first half of a file that must never appear at the output path\n');
process.stdout.write(`ready ${file.tempPath}\n`);
setInterval(() => undefined, 1000);
