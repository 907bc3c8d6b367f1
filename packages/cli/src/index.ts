// The programmatic surface of the `bridgework` command (the executable is bin.ts): the command
// runner, its I/O types, its exit codes and the safety caution. Everything else is internal.
export { runCli } from './runCli.js';
export { nodeIo, type CliIo, type CliStream } from './cliIo.js';
export { exitCodes, type ExitCode } from './exitCodes.js';
export { SAFETY_CAUTION } from './caution.js';
