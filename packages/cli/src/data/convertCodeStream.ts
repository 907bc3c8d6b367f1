import { BridgeworkError } from '@bridgework/core';
import { createClipCounter, type ClipSummary, type InterleavedConverter } from './clipCounter.js';
import type { CodeBlock, CodeSource } from './codeSource.js';
import type { CsvWriter } from './createCsvWriter.js';

/** Options of {@link convertCodeStream}. */
export interface ConvertCodeStreamOptions {
  /** The codes. */
  readonly source: CodeSource;
  /** Turns one block of interleaved codes into values (see {@link InterleavedConverter}). */
  readonly converter: InterleavedConverter;
  /** Receives the values. */
  readonly writer: CsvWriter;
  /** Called after each block is written (for a progress bar). */
  readonly onBlock?: (block: CodeBlock) => void;
}

/** The result of a conversion. */
export interface ConversionResult {
  /** Frames converted. */
  readonly frames: number;
  /** The clipped-sample summary. */
  readonly clip: ClipSummary;
}

/**
 * Converts a code file block by block: read, convert, count clipped samples, write.
 *
 * @remarks
 * One `Float64Array` of `blockFrames × channels` values is allocated and reused, so memory does
 * not grow with the file. Each block is written (and the sink awaited) before the next is read.
 * The converter's output is checked by {@link createClipCounter} on every block.
 *
 * @param options - Source, converter, writer and progress hook.
 * @returns Frames converted and the clipped-sample summary.
 * @throws {@link @bridgework/core!BridgeworkError} from the source (`parse-error`, `io-error`), the counter
 * (`model-not-finite`) or the sink; nothing is retried.
 * @example
 * ```ts
 * const result = await convertCodeStream({ source, converter, writer });
 * console.log(formatClipSummary(result.clip));
 * ```
 */
export async function convertCodeStream(options: ConvertCodeStreamOptions): Promise<ConversionResult> {
  const { source, converter, writer } = options;
  const channels = source.channels;
  const out = new Float64Array(source.blockFrames * channels);
  const counter = createClipCounter(channels);
  let frames = 0;
  for await (const block of source.blocks()) {
    const n = block.frames * channels;
    const values = n === out.length ? out : out.subarray(0, n);
    if (block.codes.length !== n) {
      throw new BridgeworkError(
        'invalid-shape',
        `a block of ${block.frames} frames must hold ${n} codes; got ${block.codes.length}`,
        {
          param: 'codes',
        },
      );
    }
    const status = converter(block.codes, channels, values);
    counter.add(values, block.frames, block.firstFrame, status);
    await writer.writeBlock(values, block.frames);
    frames += block.frames;
    options.onBlock?.(block);
  }
  await writer.finish();
  return { frames, clip: counter.summary() };
}
