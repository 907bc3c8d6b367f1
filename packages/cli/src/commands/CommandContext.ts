import type { ChannelFactory } from '../channels/loadChannels.js';
import type { CliIo } from '../cliIo.js';
import type { ProgressBar, ProgressBarOptions } from '../terminal/progressBar.js';
import type { TextStyle } from '../terminal/textStyle.js';

/** What a command body gets besides its arguments (built by the command runner). */
export interface CommandContext {
  /** The command word (`'report'`), for messages. */
  readonly command: string;
  /** Streams and environment. */
  readonly io: CliIo;
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
