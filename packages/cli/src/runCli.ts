import { isBridgeworkError } from '@bridgework/core';
import { formatCommandHelp, formatProgramHelp } from './args/formatHelp.js';
import { parseCommandLine } from './args/parseCommandLine.js';
import type { ChannelFactory } from './channels/loadChannels.js';
import type { CliIo } from './cliIo.js';
import { createCommandContext } from './commands/createCommandContext.js';
import type { CommandHelp } from './commands/CommandContext.js';
import { commands } from './commands/registry.js';
import { exitCodes } from './exitCodes.js';
import { closestName } from '@bridgework/core';
import { readVersion } from './internal/readVersion.js';

/** The help texts of {@link commands}, handed to the command bodies through their context. */
const commandHelp: CommandHelp = {
  names: commands.map((c) => c.name),
  program: () => formatProgramHelp(commands),
  command: (name) => {
    const spec = commands.find((c) => c.name === name);
    return spec === undefined ? undefined : formatCommandHelp(spec);
  },
};

/**
 * Runs the `bridgework` command in this process and returns its exit code.
 *
 * @remarks
 * `argv` is what follows the program name (`process.argv.slice(2)`). The first word picks the
 * command; `-h`/`--help` and `-V`/`--version` work at the top level, `help <command>` and
 * `<command> --help` show a command's help (on standard output, exit 0). A missing or unknown
 * command prints a short message and the usage on standard error (exit 1).
 *
 * Errors: a `BridgeworkError` from parsing or from the command (bad option, unreadable or invalid
 * file, existing output without `--force`) prints `bridgework <command>: <message>` on standard
 * error and returns 1; usage errors add a pointer to the command's help. Any other error is a
 * defect: it is reported as an internal error (with the stack when `BRIDGEWORK_DEBUG` is set)
 * and returns 1. Nothing is thrown to the caller.
 *
 * Only the option tables are loaded up front; each command's body and its heavy dependencies
 * (the channel package, yaml) are imported when it runs, so `bridgework --help` starts quickly.
 *
 * @param argv - The arguments.
 * @param io - Streams, environment and working folder (see {@link nodeIo} for the real process).
 * @returns The exit code (see {@link exitCodes}).
 * @example
 * ```ts
 * const out: string[] = [];
 * const sink = { write: (s: string) => out.push(s) };
 * const code = await runCli(['--version'], { stdout: sink, stderr: sink, env: {} });
 * // code === 0, out[0] === '0.1.0\n'
 * ```
 */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  return runCommandLine(argv, io);
}

/**
 * {@link runCli} with the channel factory its commands use (internal: not exported by the
 * package). A test hands in a kit of the channel package with a sensor kind of its own and runs
 * every command on it, which shows that the commands name no sensor kind.
 *
 * @param argv - The arguments.
 * @param io - Streams, environment and working folder.
 * @param channels - How channel files' entries are validated and made (default: the channel
 *   package's `validateChannelSpec` and `createChannel`).
 * @returns The exit code.
 */
export async function runCommandLine(
  argv: readonly string[],
  io: CliIo,
  channels?: ChannelFactory,
): Promise<number> {
  const [first, ...rest] = argv;
  if (first === undefined) {
    io.stderr.write(`bridgework: a command is required\n\n${formatProgramHelp(commands)}`);
    return exitCodes.badInput;
  }
  if (first === '-h' || first === '--help') {
    io.stdout.write(formatProgramHelp(commands));
    return exitCodes.ok;
  }
  if (first === '-V' || first === '--version') {
    io.stdout.write(`${await readVersion()}\n`);
    return exitCodes.ok;
  }
  const spec = commands.find((c) => c.name === first);
  if (spec === undefined) {
    const near = closestName(
      first,
      commands.map((c) => c.name),
    );
    const what = first.startsWith('-') ? `unknown option '${first}'` : `unknown command '${first}'`;
    io.stderr.write(
      `bridgework: ${what}${near === undefined ? '' : `; did you mean '${near}'?`}\nRun 'bridgework --help' for the list of commands.\n`,
    );
    return exitCodes.badInput;
  }

  let usage = true;
  try {
    const parsed = parseCommandLine(spec, rest);
    if (parsed.help) {
      io.stdout.write(formatCommandHelp(spec));
      return exitCodes.ok;
    }
    usage = false;
    const body = await spec.load();
    return await body.run(parsed, createCommandContext(spec.name, io, commandHelp, channels));
  } catch (e) {
    if (isBridgeworkError(e)) {
      const hint = usage ? `Run 'bridgework ${spec.name} --help' for its options.\n` : '';
      io.stderr.write(`bridgework ${spec.name}: ${e.message}\n${hint}`);
      return exitCodes.badInput;
    }
    const detail = io.env['BRIDGEWORK_DEBUG']
      ? String((e as Error).stack ?? e)
      : String((e as Error).message ?? e);
    io.stderr.write(`bridgework ${spec.name}: internal error (please report it): ${detail}\n`);
    return exitCodes.badInput;
  }
}
