import type { CliStream } from '../cliIo.js';

/** Options of {@link createProgressBar}. */
export interface ProgressBarOptions {
  /** What is being done, shown before the bar (`'converting'`). */
  readonly label: string;
  /** The amount of work in total, in `unit` (> 0; a total of 0 shows no bar). */
  readonly total: number;
  /** `'bytes'` shows amounts in kB/MB/GB; anything else is shown after plain counts. Default `'bytes'`. */
  readonly unit?: string;
}

/** A progress bar on a terminal (or nothing at all elsewhere). */
export interface ProgressBar {
  /** Whether anything is drawn (the stream is a terminal). */
  readonly active: boolean;
  /** Reports the amount done so far (in the bar's unit); redraws only when the shown figure changes. */
  update(done: number): void;
  /** Removes the bar from the terminal line, leaving the cursor at its start. */
  finish(): void;
}

function amount(x: number, unit: string): string {
  if (unit === 'bytes') {
    if (x >= 1e9) return `${(x / 1e9).toFixed(2)} GB`;
    if (x >= 1e6) return `${(x / 1e6).toFixed(1)} MB`;
    return `${(x / 1e3).toFixed(0)} kB`;
  }
  if (x >= 1e6) return `${(x / 1e6).toFixed(2)} M ${unit}`;
  if (x >= 1e4) return `${(x / 1e3).toFixed(1)} k ${unit}`;
  return `${Math.floor(x)} ${unit}`;
}

/**
 * A progress bar on `stream`, drawn only when it is an interactive terminal.
 *
 * @remarks
 * Progress goes to standard error so that it never mixes with results on standard output. When
 * the stream is not a terminal (a pipe, a file, a CI log) the bar is inactive and writes nothing,
 * so logs stay clean. The bar redraws in place with a carriage return, at most once per 0.1 %
 * of progress, and is erased by `finish()`.
 *
 * @param stream - Where to draw (standard error).
 * @param options - Label, total and unit.
 * @returns The bar.
 * @example
 * ```ts
 * const bar = createProgressBar(process.stderr, { label: 'converting', total: fileBytes });
 * bar.update(bytesRead); // converting [██████░░░░░░░░░░░░░░]  31.2 %  15.6 MB / 50.0 MB
 * bar.finish();
 * ```
 */
export function createProgressBar(stream: CliStream, options: ProgressBarOptions): ProgressBar {
  const active = stream.isTTY === true && options.total > 0;
  const unit = options.unit ?? 'bytes';
  let shown = -1;
  let drawn = false;
  return {
    active,
    update(done) {
      if (!active) return;
      const fraction = Math.min(Math.max(done / options.total, 0), 1);
      const permille = Math.floor(fraction * 1000);
      if (permille === shown) return;
      shown = permille;
      const columns = stream.columns ?? 80;
      const tail = `${(permille / 10).toFixed(1).padStart(5)} %  ${amount(done, unit)} / ${amount(options.total, unit)}`;
      const barWidth = Math.max(10, Math.min(40, columns - options.label.length - tail.length - 6));
      const full = Math.round(fraction * barWidth);
      stream.write(`\r${options.label} [${'█'.repeat(full)}${'░'.repeat(barWidth - full)}] ${tail}\u001b[K`);
      drawn = true;
    },
    finish() {
      if (active && drawn) stream.write('\r\u001b[K');
      drawn = false;
    },
  };
}
