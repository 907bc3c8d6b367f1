import type { ChannelFactory } from '../channels/loadChannels.js';
import type { CliIo } from '../cliIo.js';
import type { ProgressBar, ProgressBarOptions } from '../terminal/progressBar.js';
import type { TextStyle } from '../terminal/textStyle.js';

/** The help texts of the program's commands. */
export interface CommandHelp {
  /** Every command's name, in the help text's order. */
  readonly names: readonly string[];
  /** The program's help: its usage and the list of commands. */
  program(): string;
  /** One command's help, or `undefined` for a name that is not a command. */
  command(name: string): string | undefined;
}

/** What a command body gets besides its arguments (built by the command runner). */
export interface CommandContext {
  /** The command word (`'report'`), for messages. */
  readonly command: string;
  /** Streams and environment. */
  readonly io: CliIo;
  /**
   * The program's help texts, for `help`: built by the runner from its command table, so that no
   * command body imports the table that loads it.
   */
  readonly help: CommandHelp;
  /** Styling for standard output (plain unless it is a terminal and NO_COLOR is unset). */
  readonly stdoutStyle: TextStyle;
  /** Styling for standard error. */
  readonly stderrStyle: TextStyle;
  /** A progress bar on standard error (inactive unless it is a terminal). */
  progressBar(options: ProgressBarOptions): ProgressBar;
  /**
   * How channel files' entries are validated and made into channels; when absent, the channel
   * package's `validateChannelSpec` and `createChannel` (its built-in sensor kinds). A test hands
   * in a kit with one more kind (the channel package's `createChannelKit`) to show that no
   * command names a sensor kind.
   */
  readonly channels?: ChannelFactory;
  /** Writes a line to standard error, prefixed with `bridgework <command>: `. */
  warn(message: string): void;
}
