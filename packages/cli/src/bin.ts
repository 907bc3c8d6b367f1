#!/usr/bin/env node
/**
 * The `bridgework` executable. It loads only the argument parser and the command table; each
 * command's module (and heavy dependencies such as mathjs and yaml) is imported when it runs.
 */
import { nodeIo } from './cliIo.js';
import { exitCodes } from './exitCodes.js';
import { runCli } from './runCli.js';
import { stopWithParent } from './internal/pendingTempFiles.js';

// The repository's `pnpm bridgework` and `pnpm demo` set this: pnpm does not pass SIGTERM on.
if (process.env['BRIDGEWORK_STOP_WITH_PARENT'] === '1') stopWithParent();

// A reader that closes the pipe early (`bridgework convert … | head -2`) ends the command quietly,
// with exit code 0, as Unix tools do; the exit handlers remove any temporary file.
process.stdout.on('error', (e: NodeJS.ErrnoException) => {
  if (e.code === 'EPIPE') process.exit(exitCodes.ok);
  process.stderr.write(`bridgework: cannot write to standard output: ${e.message}\n`);
  process.exit(exitCodes.badInput);
});

// Setting exitCode (rather than calling process.exit) lets piped output drain completely.
process.exitCode = await runCli(process.argv.slice(2), nodeIo());
