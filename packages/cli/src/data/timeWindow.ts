import { BridgeworkError } from '@bridgework/core';
import type { CodeSource } from './codeSource.js';
import type { CodeLanes } from './decodeFrames.js';

/** A window of a recording in seconds from its start: `[startSeconds, endSeconds)`. */
export interface TimeWindow {
  /** Start, seconds after the first frame (≥ 0). */
  readonly startSeconds: number;
  /** End (exclusive), seconds after the first frame (> start). */
  readonly endSeconds: number;
}

const units: Readonly<Record<string, number>> = { ms: 1e-3, s: 1, min: 60, h: 3600 };

function parseSeconds(text: string, option: string): number {
  const m = /^\s*(\d+(?:\.\d*)?|\.\d+)(?:e([+-]?\d+))?\s*(ms|s|min|h)?\s*$/.exec(text);
  const value =
    m === null
      ? Number.NaN
      : Number(`${m[1]}${m[2] === undefined ? '' : `e${m[2]}`}`) * (units[m[3] ?? 's'] as number);
  if (!Number.isFinite(value)) {
    throw new BridgeworkError(
      'invalid-option',
      `${option}: '${text}' is not a time; write seconds, or a number with ms, s, min or h (e.g. 10s, 2min)`,
      { param: option, value: text },
    );
  }
  return value;
}

/**
 * Reads a window of a recording from text: `10s` (the first 10 seconds) or `120s..130s` (from 120 s
 * to 130 s after the start); plain numbers are seconds, and `ms`, `s`, `min`, `h` are understood.
 *
 * @param text - The text.
 * @param option - The option's name, for messages (e.g. `--zero-window`).
 * @returns The window.
 * @throws {@link @bridgework/core!BridgeworkError} `invalid-option` for text that is not a window,
 * or an empty one.
 * @example
 * ```ts
 * parseTimeWindow('2min..3min', '--zero-window'); // { startSeconds: 120, endSeconds: 180 }
 * ```
 */
export function parseTimeWindow(text: string, option: string): TimeWindow {
  const parts = String(text).split('..');
  if (parts.length > 2) {
    throw new BridgeworkError(
      'invalid-option',
      `${option}: '${text}' is not a window; write 10s or 120s..130s`,
      {
        param: option,
        value: text,
      },
    );
  }
  const [a, b] = parts as [string, string | undefined];
  const window =
    b === undefined
      ? { startSeconds: 0, endSeconds: parseSeconds(a, option) }
      : { startSeconds: parseSeconds(a, option), endSeconds: parseSeconds(b, option) };
  if (!(window.endSeconds > window.startSeconds)) {
    throw new BridgeworkError(
      'invalid-option',
      `${option}: '${text}' is an empty window; its end must come after its start`,
      { param: option, value: text },
    );
  }
  return window;
}

/** How frames are placed in time: a sample rate, or the recording's own time column. */
export interface RecordingClock {
  /** Frames per second, when known. */
  readonly sampleRateHertz?: number;
}

/** The mean code of each channel over a window, with the counts behind it. */
export interface WindowMeans {
  /** Per channel, the mean of its valid codes in the window (NaN when it had none). */
  readonly meanCodes: readonly number[];
  /** Per channel, the valid codes averaged. */
  readonly validCodes: readonly number[];
  /** Frames in the window. */
  readonly frames: number;
  /** First frame of the window. */
  readonly firstFrame: number;
  /** Last frame of the window. */
  readonly lastFrame: number;
}

/**
 * Reads a window of a recording and averages each channel's codes over it (the zero reading of a
 * re-zero taken from the data).
 *
 * @remarks
 * Frame `f` lies at `t = f / sampleRateHertz` when a sample rate is given, else at the time
 * column's value less the first frame's (a raw time stamp in ticks times its seconds per tick, or
 * a CSV time column in seconds). The window holds the frames with `startSeconds ≤ t < endSeconds`;
 * times must grow from frame to frame, and reading stops at the first frame past the window. Only codes for which `valid(channel, code)` holds are averaged (codes at
 * the rails say nothing about the zero). Integer codes are summed exactly (per block in doubles,
 * whose sums of at most 2^24 codes below 2^32 are exact, then across blocks in `BigInt`), so the
 * mean is the exact quotient rounded to a double (within one unit in the last place); non-integer
 * codes are summed with Neumaier's compensated sum.
 *
 * @param source - The recording.
 * @param window - The window.
 * @param clock - The sample rate, when the recording has no time column (or to use instead of it).
 * @param valid - Whether a code of a channel converts (inside its valid codes).
 * @returns The mean codes and counts.
 * @throws {@link @bridgework/core!BridgeworkError} `missing-option` when neither a sample rate nor a
 * time column places the frames in time (or a raw time stamp has no seconds per tick);
 * `out-of-range` when the window holds no frame.
 */
export async function windowMeans(
  source: CodeSource,
  window: TimeWindow,
  clock: RecordingClock,
  valid: (channel: number, code: number) => boolean,
): Promise<WindowMeans> {
  const rate = clock.sampleRateHertz;
  const time = source.timeColumn;
  if (rate === undefined) {
    if (time === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `a time window needs the frames' times: give the sample rate (--sample-rate) or a time column (raw: --time-stamp; CSV: --time-column)`,
        { param: 'sampleRateHertz' },
      );
    }
    if (time.type !== 'seconds' && time.secondsPerTick === undefined) {
      throw new BridgeworkError(
        'missing-option',
        `a time window needs the seconds per tick of the ${time.type} time stamp (--tick) or the sample rate (--sample-rate)`,
        { param: 'secondsPerTick' },
      );
    }
  }
  const n = source.channels;
  const totals = new Array<bigint>(n).fill(0n);
  const sums = new Array<number>(n).fill(0);
  const compensations = new Array<number>(n).fill(0);
  const counts = new Array<number>(n).fill(0);
  let integers = true;
  let firstFrame = -1;
  let lastFrame = -1;
  let origin: number | bigint | undefined;
  const secondsOf = (frame: number, stamp: number | bigint | undefined): number => {
    if (rate !== undefined) return frame / rate;
    const s = stamp as number | bigint;
    origin ??= s;
    const perTick = time?.type === 'seconds' ? 1 : (time?.secondsPerTick as number);
    return typeof s === 'bigint'
      ? Number(s - (origin as bigint)) * perTick
      : (s - (origin as number)) * perTick;
  };
  outer: for await (const block of source.blocks()) {
    const codes: CodeLanes = block.codes;
    for (let f = 0; f < block.frames; f++) {
      const frame = block.firstFrame + f;
      const t = secondsOf(frame, block.timeStamps?.[f]);
      if (t < window.startSeconds) continue;
      if (t >= window.endSeconds) break outer; // times only grow: nothing later is inside
      if (firstFrame < 0) firstFrame = frame;
      lastFrame = frame;
      for (let j = 0; j < n; j++) {
        const x = codes[j * block.laneStride + f] as number;
        if (!valid(j, x)) continue;
        counts[j] = (counts[j] as number) + 1;
        if (integers && Number.isInteger(x)) {
          sums[j] = (sums[j] as number) + x;
          if (Math.abs(sums[j] as number) >= 2 ** 52) {
            totals[j] = (totals[j] as bigint) + BigInt(sums[j] as number);
            sums[j] = 0;
          }
        } else {
          if (integers) {
            // Switch to the compensated sum, carrying what was summed exactly so far.
            for (let k = 0; k < n; k++) {
              sums[k] = Number((totals[k] as bigint) + BigInt(sums[k] as number));
              totals[k] = 0n;
            }
            integers = false;
          }
          const s = sums[j] as number;
          const t2 = s + x;
          compensations[j] =
            (compensations[j] as number) + (Math.abs(s) >= Math.abs(x) ? s - t2 + x : x - t2 + s);
          sums[j] = t2;
        }
      }
    }
  }
  if (firstFrame < 0) {
    throw new BridgeworkError(
      'out-of-range',
      `the window ${window.startSeconds} s to ${window.endSeconds} s holds no frame of ${source.file}`,
      { param: 'window', value: [window.startSeconds, window.endSeconds] },
    );
  }
  const meanCodes = counts.map((c, j) => {
    if (c === 0) return Number.NaN;
    if (integers) return exactMean((totals[j] as bigint) + BigInt(sums[j] as number), c);
    return ((sums[j] as number) + (compensations[j] as number)) / c;
  });
  return { meanCodes, validCodes: counts, frames: lastFrame - firstFrame + 1, firstFrame, lastFrame };
}

/** total / count rounded to a double, within one unit in the last place. */
function exactMean(total: bigint, count: number): number {
  const c = BigInt(count);
  const q = total / c;
  const r = total - q * c;
  return Number(q) + Number(r) / count;
}
